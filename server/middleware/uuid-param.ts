import type { RequestHandler } from 'express';
import { z } from 'zod';
import { notFound } from '../errors';

const uuid = z.uuid();

/** A malformed id names nothing that exists: 404, never a database error. */
export function uuidParam(name: string, what: string): RequestHandler {
  return (req, _res, next) => {
    if (!uuid.safeParse(req.params[name]).success) throw notFound(what);
    next();
  };
}
