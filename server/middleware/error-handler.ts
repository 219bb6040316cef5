import type { ErrorRequestHandler, RequestHandler } from 'express';
import { MulterError } from 'multer';
import { ForeignKeyConstraintError, UniqueConstraintError, ValidationError as SequelizeValidationError } from 'sequelize';
import { ZodError } from 'zod';
import { AppError } from '../errors';

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
  if (err instanceof ForeignKeyConstraintError) {
    // A last line of defence: services check references first and say which ones.
    return { status: 409, body: { error: { code: 'in_use', message: 'This is still referred to elsewhere, so it cannot be changed this way.' } } };
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

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const { status, body } = toErrorResponse(err);
  if (status >= 500) console.error(`[api] ${req.method} ${req.originalUrl} failed:`, err);
  res.status(status).json(body);
};

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.baseUrl}${req.path}.` } });
};
