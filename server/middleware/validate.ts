import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { assertStorable } from './storable-input';

type Parts = { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType };

/**
 * Parses the named parts of the request and keeps the parsed values in res.locals (Express 5's
 * req.query is read-only). A ZodError reaches the error middleware as a 400 naming each field;
 * text that cannot be stored (NUL, a broken character) is refused first, also by field.
 */
export function validate(parts: Parts): RequestHandler {
  return (req, res, next) => {
    // Bodies that arrive after the JSON parser (multipart fields, CSV text) are checked here.
    if (parts.body) assertStorable(req.body);
    if (parts.params) res.locals.params = parts.params.parse(req.params);
    if (parts.query) res.locals.query = parts.query.parse(req.query);
    if (parts.body) res.locals.body = parts.body.parse(req.body ?? {});
    next();
  };
}
