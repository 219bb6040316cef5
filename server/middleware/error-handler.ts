import type { ErrorRequestHandler, RequestHandler } from 'express';
import { MulterError } from 'multer';
import {
  ConnectionError,
  DatabaseError,
  ForeignKeyConstraintError,
  UniqueConstraintError,
  ValidationError as SequelizeValidationError,
} from 'sequelize';
import { ZodError } from 'zod';
import { AppError } from '../errors';
import { describeError, redactUrl, type Logger } from '../logger';

/** busboy's messages for a multipart or urlencoded body it cannot parse. */
const BROKEN_FORM = /^(Malformed part header|Unexpected end of form|Malformed urlencoded form|Multipart: Boundary not found|Unsupported content type)/;

type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string> } };

function fieldsOf(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join('.') || '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Maps every error to one body shape, { error: { code, message, fields? } }. */
export function toErrorResponse(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof AppError) {
    return { status: err.status, body: { error: { code: err.code, message: err.message, fields: err.fields } } };
  }
  if (err instanceof ZodError) {
    // The message names no field: the fields' own names are for programs; each form puts the
    // messages beside its fields, under the labels the person sees.
    const fields = fieldsOf(err);
    const count = Object.keys(fields).length;
    return {
      status: 400,
      body: { error: { code: 'invalid_input', message: count === 1 ? 'One answer needs a change.' : `${count} answers need a change.`, fields } },
    };
  }
  if (err instanceof UniqueConstraintError) {
    const fields: Record<string, string> = {};
    for (const item of err.errors) if (item.path) fields[item.path] = 'is already taken';
    return { status: 409, body: { error: { code: 'conflict', message: 'That already exists.', fields } } };
  }
  if (err instanceof MulterError) {
    const field = err.field ?? 'file';
    if (err.code === 'LIMIT_FILE_SIZE') {
      return { status: 413, body: { error: { code: 'file_too_large', message: `The file for ${field} is too large.`, fields: { [field]: 'is too large' } } } };
    }
    return { status: 400, body: { error: { code: 'invalid_upload', message: `The upload could not be taken: ${err.message}.`, fields: { [field]: err.message } } } };
  }
  // busboy (under multer) refuses a multipart body it cannot read with a plain Error.
  if (err instanceof Error && BROKEN_FORM.test(err.message)) {
    return { status: 400, body: { error: { code: 'invalid_upload', message: 'The form could not be read (a part of it is malformed). Please send it again.' } } };
  }
  if (err instanceof ForeignKeyConstraintError) {
    // A last line of defence: services check references first and say which ones.
    return { status: 409, body: { error: { code: 'in_use', message: 'This is still referred to elsewhere, so it cannot be changed this way.' } } };
  }
  // The database cannot be reached, is shutting down or refuses connections for now: the request
  // may simply be tried again, which is what 503 says (PostgreSQL error classes 08 and 57P).
  if (err instanceof ConnectionError || (err instanceof DatabaseError && /^(08|57P|53300)/.test(pgCode(err)))) {
    return { status: 503, body: { error: { code: 'unavailable', message: 'Basted cannot reach its database just now. Please try again in a minute.' } } };
  }
  // PostgreSQL class 22 (data exception): a value the column cannot hold. The schemas refuse these
  // first, naming the field; this is the last line of defence, and nothing was saved.
  if (err instanceof DatabaseError && pgCode(err).startsWith('22')) {
    return { status: 400, body: { error: { code: 'invalid_input', message: 'A value in the request cannot be stored (it is out of range or holds characters that cannot be kept). Nothing was saved.' } } };
  }
  if (err instanceof SequelizeValidationError) {
    const fields: Record<string, string> = {};
    for (const item of err.errors) if (item.path) fields[item.path] = item.message;
    return { status: 400, body: { error: { code: 'invalid_input', message: 'Please check the fields.', fields } } };
  }
  // body-parser's errors (malformed JSON, a body over the limit) carry their own status.
  const status = (err as { status?: unknown })?.status;
  const type = (err as { type?: unknown })?.type;
  if (typeof status === 'number' && status >= 400 && status < 500 && typeof type === 'string') {
    const message =
      type === 'entity.parse.failed'
        ? 'The request body is not valid JSON.'
        : type === 'entity.too.large'
          ? 'The request body is too large.'
          : 'The request could not be read.';
    return { status, body: { error: { code: type.replace(/\./g, '_'), message } } };
  }
  return { status: 500, body: { error: { code: 'internal', message: 'Something went wrong on our side.' } } };
}

function pgCode(err: DatabaseError): string {
  const code = (err.original as { code?: unknown } | undefined)?.code;
  return typeof code === 'string' ? code : '';
}

/**
 * The error middleware. Server-side failures are logged without the SQL or its parameters and
 * with the URL's secrets redacted (see logger.ts); a 503 says when to try again.
 */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const { status, body } = toErrorResponse(err);
    if (status >= 500) logger.error({ err: describeError(err), method: req.method, url: redactUrl(req.originalUrl) }, 'request failed');
    if (status === 503) res.setHeader('Retry-After', '30');
    res.status(status).json(body);
  };
}

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.baseUrl}${req.path}.` } });
};
