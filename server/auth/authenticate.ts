import type { RequestHandler, Response } from 'express';
import { Op, QueryTypes, type ModelStatic, type Model } from 'sequelize';
import { Membership, RevokedSession, User } from '../../db/models';
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

/** `"column" AS "attribute"` for each attribute a model's default scope reads, with a table alias and a prefix. */
function columnsOf(model: ModelStatic<Model>, alias: string, prefix: string, exclude: string[] = []): string {
  return Object.entries(model.getAttributes())
    .filter(([name]) => !exclude.includes(name))
    .map(([name, attribute]) => `${alias}."${attribute.field ?? name}" AS "${prefix}${name}"`)
    .join(', ');
}

let sessionSql: { user: string; member: string } | null = null;
const STUDIO_PATH = /^\/studios\/([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})(?:\/|$)/i;

/**
 * The session's user (without the password hash, as the default scope), whether the session was
 * signed out, and — for a request to a studio's routes — the caller's membership of that studio,
 * in one query: every signed-in request pays this, so it is one round trip with no model queries.
 */
async function lookUpSession(claims: SessionClaims, studioId: string | null) {
  sessionSql ??= {
    user: columnsOf(User as unknown as ModelStatic<Model>, 'u', 'u.', ['passwordHash']),
    member: columnsOf(Membership as unknown as ModelStatic<Model>, 'm', 'm.'),
  };
  const [row] = await User.sequelize!.query<Record<string, unknown>>(
    `SELECT ${sessionSql.user}, EXISTS (SELECT 1 FROM revoked_sessions WHERE session_id = $2) AS revoked${studioId ? `, ${sessionSql.member}` : ''}
       FROM users u${studioId ? ' LEFT JOIN memberships m ON m.studio_id = $3 AND m.user_id = u.id' : ''}
      WHERE u.id = $1`,
    { bind: studioId ? [claims.sub, claims.sid, studioId] : [claims.sub, claims.sid], type: QueryTypes.SELECT },
  );
  if (!row) return null;
  const part = (prefix: string) => Object.fromEntries(Object.entries(row).filter(([k]) => k.startsWith(prefix)).map(([k, v]) => [k.slice(prefix.length), v]));
  const user = User.build(part('u.') as never, { isNewRecord: false, raw: true });
  const member = studioId ? part('m.') : null;
  const membership = member?.id ? Membership.build(member as never, { isNewRecord: false, raw: true }) : null;
  return { user, revoked: Boolean(row.revoked), membership: studioId ? { studioId, membership } : null };
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
    const found = claims ? await lookUpSession(claims, STUDIO_PATH.exec(req.path)?.[1].toLowerCase() ?? null) : null;
    if (!claims || !found || found.revoked || found.user.sessionVersion !== claims.ver) {
      if (!bearer) clearSessionCookie(res, auth);
      return next();
    }
    const user = found.user;
    res.locals.user = user;
    res.locals.session = claims;
    // requireStudio uses it for the studio in the path instead of asking again.
    if (found.membership) res.locals.sessionMembership = found.membership;
    if (!bearer && Date.now() / 1000 - claims.iat > RENEW_AFTER_SECONDS) setSessionCookie(res, user, auth, claims.sid);
    next();
  };
}
