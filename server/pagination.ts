import type { Request, Response } from 'express';
import { z } from 'zod';
import { badRequest } from './errors';

/** Rows per page of a trial's lists unless the caller asks for fewer (or more, up to MAX_PAGE). */
export const DEFAULT_PAGE = 200;
export const MAX_PAGE = 500;

const pageQuery = z.object({
  limit: z.coerce.number({ error: 'is a number of rows' }).int('is a whole number of rows').min(1, 'is at least 1').max(MAX_PAGE, `is at most ${MAX_PAGE}`).optional(),
  cursor: z.string().max(500).optional(),
});

/** A position in a list ordered by (time, id): the last row of the page before. */
export type Cursor = { at: string; id: string; stage?: string };

/**
 * Reads `limit` and `cursor` from the query. The cursor is opaque to the caller (base64url JSON of
 * the last row's sort keys); a damaged one is a 400 naming it, never a 500.
 */
export function readPage(req: Request): { limit: number; after: Cursor | null } {
  const parsed = pageQuery.safeParse({ limit: req.query.limit, cursor: req.query.cursor });
  if (!parsed.success) {
    const fields: Record<string, string> = {};
    for (const issue of parsed.error.issues) fields[String(issue.path[0])] ??= issue.message;
    throw badRequest('The page asked for is not valid.', fields);
  }
  let after: Cursor | null = null;
  if (parsed.data.cursor) {
    try {
      const value = JSON.parse(Buffer.from(parsed.data.cursor, 'base64url').toString('utf8')) as Cursor;
      if (typeof value.at !== 'string' || typeof value.id !== 'string' || Number.isNaN(Date.parse(value.at)) || !/^[0-9a-f-]{36}$/i.test(value.id)) throw new Error('shape');
      after = value;
    } catch {
      throw badRequest('The page asked for is not valid.', { cursor: 'is not a cursor this list gave out' });
    }
  }
  return { limit: parsed.data.limit ?? DEFAULT_PAGE, after };
}

export function encodeCursor(cursor: Cursor): string {
  return Buffer.from(JSON.stringify(cursor), 'utf8').toString('base64url');
}

/**
 * Sends one page as a JSON array (the shape the list always had) and, when more rows follow, the
 * next page's address in a `Link: <…>; rel="next"` header (RFC 8288) and the cursor alone in
 * `X-Next-Cursor`.
 */
export function sendPage<T>(req: Request, res: Response, rows: T[], next: Cursor | null): void {
  if (next) {
    const cursor = encodeCursor(next);
    const url = new URL(req.originalUrl, 'http://local');
    url.searchParams.set('cursor', cursor);
    res.setHeader('Link', `<${url.pathname}${url.search}>; rel="next"`);
    res.setHeader('X-Next-Cursor', cursor);
  }
  res.json(rows);
}
