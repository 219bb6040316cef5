import { createSecretKey, randomUUID, type KeyObject } from 'node:crypto';
import jwt from 'jsonwebtoken';
import { z } from 'zod';
import type { Config } from '../config';

export const SESSION_COOKIE = 'basted_session';

/**
 * What a session token says: the user (`sub`), the session (`sid`, what signing out revokes), the
 * user's session version when it was issued (a password reset moves it on), and its times.
 */
export type SessionClaims = { sub: string; sid: string; ver: number; iat: number; exp: number };

const claimsSchema = z.object({
  sub: z.uuid(),
  sid: z.uuid(),
  ver: z.number().int().min(0),
  iat: z.number().int(),
  // Required: a token without an end would be a session that never ends.
  exp: z.number().int(),
});

/**
 * The signing key as a KeyObject, made once per secret: given a string, jsonwebtoken first tries
 * to read it as a PEM public key (and throws) and then derives the secret key again, on every
 * call — about a millisecond a request.
 */
const keys = new Map<string, KeyObject>();
function keyOf(secret: string): KeyObject {
  let key = keys.get(secret);
  if (!key) {
    key = createSecretKey(Buffer.from(secret, 'utf8'));
    keys.set(secret, key);
  }
  return key;
}

export function issueSessionToken(user: { id: string; sessionVersion: number }, auth: Config['auth'], sessionId: string = randomUUID()): string {
  return jwt.sign({ ver: user.sessionVersion, sid: sessionId }, keyOf(auth.jwtSecret), {
    subject: user.id,
    expiresIn: `${auth.sessionDays}d`,
    algorithm: 'HS256',
  });
}

/**
 * The claims of a valid token, or null for a missing, expired, forged or malformed one — and for
 * a token that lacks an expiry, names no session, names its user by anything but an id, or claims
 * to last longer than sessions do.
 */
export function readSessionToken(token: string, auth: Config['auth']): SessionClaims | null {
  try {
    const verified = jwt.verify(token, keyOf(auth.jwtSecret), { algorithms: ['HS256'] });
    const claims = claimsSchema.safeParse(verified);
    if (!claims.success) return null;
    // A minute of leeway for clocks; anything longer was not issued by this configuration.
    if (claims.data.exp - claims.data.iat > auth.sessionDays * 86_400 + 60) return null;
    return claims.data;
  } catch {
    return null;
  }
}
