/** An error the API reports to the caller as it is: status, a stable code, a message, and per-field messages. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what = 'resource') => new AppError(404, 'not_found', `No such ${what}.`);
export const forbidden = (message = 'You may not do this.') => new AppError(403, 'forbidden', message);
/**
 * Refused by ownership: the thing exists but belongs to someone else (another tester's report,
 * photo or enrolment; a trial the caller is not part of). Nothing of it is returned.
 */
export const notYours = (what: string) => new AppError(403, 'forbidden', `This ${what} is not yours to see or change.`);
export const unauthenticated = (message = 'Sign in first.') => new AppError(401, 'unauthenticated', message);
export const badRequest = (message: string, fields?: Record<string, string>) =>
  new AppError(400, 'invalid_input', message, fields);
export const conflict = (message: string, fields?: Record<string, string>) =>
  new AppError(409, 'conflict', message, fields);
export const unavailable = (message: string) => new AppError(503, 'unavailable', message);
