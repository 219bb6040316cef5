import type { RequestHandler, Response } from 'express';
import { Op } from 'sequelize';
import { RevokedSession, User } from '../../db/models';
import type { Config } from '../config';
import { issueSessionToken, readSessionToken, SESSION_COOKIE, type SessionClaims } from './session-token';

// A cookie session older than this gets a fresh token, so an active user never expires.
const RENEW_AFTER_SECONDS = 24 * 60 * 60;

/**
 * Starts a session (or renews one, keeping its id) in the httpOnly cookie. The token is never
 * put in a response body: a script on the page cannot read it.
 */
export function setSessionCookie(res: Response, user: User, auth: Config['auth'], sessionId?: string): void {
  const token = issueSessionToken(user, auth, sessionId);
  res.cookie(SESSION_COOKIE, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: auth.secureCookies,
    path: '/',
    maxAge: auth.sessionDays * 24 * 60 * 60 * 1000,
  });
}

export function clearSessionCookie(res: Response, auth: Config['auth']): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: auth.secureCookies, path: '/' });
}

/**
 * Ends one session on every instance: its id is recorded until any token of it would have
 * expired (a renewed token lasts at most sessionDays from now). Expired records are pruned here.
 */
export async function revokeSession(claims: SessionClaims, auth: Config['auth']): Promise<void> {
  const until = new Date(Date.now() + auth.sessionDays * 86_400_000);
  await RevokedSession.findOrCreate({ where: { sessionId: claims.sid }, defaults: { sessionId: claims.sid, userId: claims.sub, expiresAt: until } });
  await RevokedSession.destroy({ where: { expiresAt: { [Op.lt]: new Date() } } });
}

/**
 * Reads the session from the httpOnly cookie (the web app) or a Bearer header (API clients, which
 * send the same token back) and puts the user in res.locals.user and the claims in
 * res.locals.session. A token issued before the user's last password reset, or of a session that
 * was signed out, no longer counts. Roles are not in the token: every studio route reads the
 * membership afresh, so a removed member or a changed role takes effect on the next request.
 * Never refuses a request itself: the guards do.
 */
export function authenticate(auth: Config['auth']): RequestHandler {
  return async (req, res, next) => {
    const header = req.get('authorization');
    const bearer = header?.toLowerCase().startsWith('bearer ') ? header.slice(7).trim() : null;
    const cookie = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
    const token = bearer || cookie;
    if (!token) return next();

    const claims = readSessionToken(token, auth);
    const [user, revoked] = claims ? await Promise.all([User.findByPk(claims.sub), RevokedSession.findByPk(claims.sid)]) : [null, null];
    if (!claims || !user || revoked || user.sessionVersion !== claims.ver) {
      if (!bearer) clearSessionCookie(res, auth);
      return next();
    }
    res.locals.user = user;
    res.locals.session = claims;
    if (!bearer && Date.now() / 1000 - claims.iat > RENEW_AFTER_SECONDS) setSessionCookie(res, user, auth, claims.sid);
    next();
  };
}
