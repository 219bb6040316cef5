import type { RequestHandler, Response } from 'express';
import { User } from '../../db/models';
import type { Config } from '../config';
import { issueSessionToken, readSessionToken, SESSION_COOKIE } from './session-token';

// A cookie session older than this gets a fresh token, so an active user never expires.
const RENEW_AFTER_SECONDS = 24 * 60 * 60;

export function setSessionCookie(res: Response, user: User, auth: Config['auth']): string {
  const token = issueSessionToken(user, auth);
  res.cookie(SESSION_COOKIE, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: auth.secureCookies,
    path: '/',
    maxAge: auth.sessionDays * 24 * 60 * 60 * 1000,
  });
  return token;
}

export function clearSessionCookie(res: Response, auth: Config['auth']): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: auth.secureCookies, path: '/' });
}

/**
 * Reads the session from the httpOnly cookie (the web app) or a Bearer header (API clients)
 * and puts the user in res.locals.user. A token issued before the user's last password reset
 * no longer counts. Never refuses a request itself: the guards do.
 */
export function authenticate(auth: Config['auth']): RequestHandler {
  return async (req, res, next) => {
    const header = req.get('authorization');
    const bearer = header?.toLowerCase().startsWith('bearer ') ? header.slice(7).trim() : null;
    const cookie = (req.cookies as Record<string, string> | undefined)?.[SESSION_COOKIE];
    const token = bearer || cookie;
    if (!token) return next();

    const claims = readSessionToken(token, auth);
    const user = claims ? await User.findByPk(claims.sub) : null;
    if (!claims || !user || user.sessionVersion !== claims.ver) {
      if (!bearer) clearSessionCookie(res, auth);
      return next();
    }
    res.locals.user = user;
    if (!bearer && Date.now() / 1000 - claims.iat > RENEW_AFTER_SECONDS) setSessionCookie(res, user, auth);
    next();
  };
}
