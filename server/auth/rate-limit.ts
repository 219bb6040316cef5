import { rateLimit } from 'express-rate-limit';
import type { RequestHandler } from 'express';

const WINDOW_MS = 15 * 60 * 1000;

/**
 * Limits sign-in and password-reset attempts per client address. The counts live in this
 * process (express-rate-limit's memory store): several instances each count on their own.
 */
export function authRateLimit(limit: number): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (req, res) => {
      const reset = (req as { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      const minutes = reset ? Math.max(1, Math.ceil((reset.getTime() - Date.now()) / 60_000)) : 15;
      res.status(429).json({
        error: {
          code: 'rate_limited',
          message: `Too many attempts from your connection. Please wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`,
        },
      });
    },
  });
}
