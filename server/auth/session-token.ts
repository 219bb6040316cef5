import jwt from 'jsonwebtoken';
import type { Config } from '../config';

export const SESSION_COOKIE = 'basted_session';

export type SessionClaims = { sub: string; ver: number; iat: number; exp: number };

export function issueSessionToken(user: { id: string; sessionVersion: number }, auth: Config['auth']): string {
  return jwt.sign({ ver: user.sessionVersion }, auth.jwtSecret, {
    subject: user.id,
    expiresIn: `${auth.sessionDays}d`,
    algorithm: 'HS256',
  });
}

/** The claims of a valid token, or null for a missing, expired, forged or malformed one. */
export function readSessionToken(token: string, auth: Config['auth']): SessionClaims | null {
  try {
    const claims = jwt.verify(token, auth.jwtSecret, { algorithms: ['HS256'] });
    if (typeof claims !== 'object' || typeof claims.sub !== 'string' || typeof claims.ver !== 'number') return null;
    return claims as SessionClaims;
  } catch {
    return null;
  }
}
