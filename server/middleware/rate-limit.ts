import type { Request, RequestHandler, Response } from 'express';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';

/**
 * Rate limits whose counters live in PostgreSQL (table rate_limits, rate-limiter-flexible's
 * store), so every instance behind a load balancer counts against the same numbers. The client's
 * address is `req.ip`, which believes only the proxies named by TRUST_PROXY.
 */
export type Limiter = {
  name: string;
  points: number;
  durationSeconds: number;
  store: RateLimiterPostgres;
};

export function createLimiter(sequelize: Sequelize, name: string, points: number, durationSeconds: number): Limiter {
  const store = new RateLimiterPostgres({
    storeClient: sequelize,
    storeType: 'sequelize',
    tableName: 'rate_limits',
    // Made by the migration 0016-rate-limits; the store must not create tables of its own.
    tableCreated: true,
    keyPrefix: name,
    points,
    duration: durationSeconds,
  });
  return { name, points, durationSeconds, store };
}

/** Every limit of the app, built once per app from the configuration. */
export function createLimiters(sequelize: Sequelize, limits: Config['limits']) {
  return {
    /** Failed sign-ins (and spent or wrong link tokens) per client address, 15 minutes. */
    signIn: createLimiter(sequelize, 'sign-in', limits.signIn, 15 * 60),
    /** Reset requests per client address, 15 minutes. */
    resetByAddress: createLimiter(sequelize, 'reset-ip', limits.signIn, 15 * 60),
    /** Reset mails per target address, an hour: nobody's inbox is flooded through Basted. */
    resetByEmail: createLimiter(sequelize, 'reset-email', 5, 60 * 60),
    /** Sign-up requests per client address, an hour. */
    signUpByAddress: createLimiter(sequelize, 'sign-up-ip', limits.signUp, 60 * 60),
    /** Sign-up mails per target address, an hour. */
    signUpByEmail: createLimiter(sequelize, 'sign-up-email', 5, 60 * 60),
    /** Invitations per studio, 24 hours. */
    invitations: createLimiter(sequelize, 'invitations', limits.invitationsPerDay, 24 * 60 * 60),
    /** Photo uploads per person, an hour. */
    photoUploads: createLimiter(sequelize, 'photo-uploads', limits.photoUploadsPerHour, 60 * 60),
  };
}
export type Limiters = ReturnType<typeof createLimiters>;

function waitWords(ms: number): string {
  const minutes = Math.max(1, Math.ceil(ms / 60_000));
  if (minutes < 120) return `${minutes} minute${minutes === 1 ? '' : 's'}`;
  const hours = Math.ceil(minutes / 60);
  return `${hours} hours`;
}

type LimitOptions = {
  /** The counter's key for this request; null skips the limit (e.g. a body that failed validation). */
  key: (req: Request, res: Response) => string | null;
  /** Who is limited, for the message: "your connection", "this studio"… */
  who: string;
  /**
   * Count only requests that fail (the default counts every one): a point is taken before the
   * handler runs and given back when the answer is a success, so parallel attempts cannot
   * slip past the limit.
   */
  failuresOnly?: boolean;
  /** Give the point back when the request was refused for another reason (a 4xx or 5xx answer). */
  refundRefused?: boolean;
};

/**
 * Middleware taking one point from `limiter` under the request's key; past the limit the answer
 * is 429 with Retry-After and a message saying how long to wait. A store that cannot be reached
 * is an error like any other database failure (503), never a silent pass.
 */
export function rateLimit(limiter: Limiter, options: LimitOptions): RequestHandler {
  return async (req, res, next) => {
    const key = options.key(req, res);
    if (key === null) return next();
    try {
      await limiter.store.consume(key, 1);
    } catch (rejection) {
      if (!(rejection instanceof RateLimiterRes)) throw rejection;
      const seconds = Math.max(1, Math.ceil(rejection.msBeforeNext / 1000));
      res.setHeader('Retry-After', String(seconds));
      res.status(429).json({
        error: {
          code: 'rate_limited',
          message: `Too many attempts from ${options.who}. Please wait ${waitWords(rejection.msBeforeNext)} and try again.`,
        },
      });
      return;
    }
    if (options.failuresOnly || options.refundRefused) {
      res.on('finish', () => {
        const success = res.statusCode < 400;
        if ((options.failuresOnly && success) || (options.refundRefused && !success)) {
          limiter.store.reward(key, 1).catch(() => undefined);
        }
      });
    }
    next();
  };
}

/** The client's address as Express sees it through the trusted proxies. */
export const clientAddress = (req: Request) => req.ip ?? req.socket.remoteAddress ?? 'unknown';
