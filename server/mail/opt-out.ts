import jwt from 'jsonwebtoken';
import type { Config } from '../config';
import type { MailCategory } from '../../db/models/outbox-message';

/** The kinds of mail a person may turn off, each with its preference column and its words. */
export const OPTIONAL_KINDS = {
  reminders: { field: 'mailReminders', what: 'reminders about your due dates', label: 'reminders about due dates' },
  'trial-news': { field: 'mailTrialNews', what: 'news about trials you applied to', label: 'news about your trials (decisions, new drafts)' },
  digest: { field: 'mailDigest', what: 'the daily list of overdue testers', label: 'the daily list of overdue testers' },
} as const;
export type OptionalKind = keyof typeof OPTIONAL_KINDS;

export function isOptional(category: MailCategory): category is OptionalKind {
  return category !== 'essential';
}

const PURPOSE = 'mail-opt-out';

// A key of its own, derived from the session secret, so an opt-out link can never pass as a
// session token nor the other way round.
const keyOf = (auth: Config['auth']) => `${auth.jwtSecret}:${PURPOSE}`;

/**
 * A link that turns one kind of mail off for one person, without signing in. It does not expire:
 * an old e-mail's link must still work, and all it can do is stop mail.
 */
export function optOutUrl(config: Config, userId: string, kind: OptionalKind): string {
  const token = jwt.sign({ purpose: PURPOSE, kind }, keyOf(config.auth), { subject: userId, algorithm: 'HS256', noTimestamp: true });
  return `${config.publicUrl}/api/mail/opt-out/${token}`;
}

export function readOptOutToken(token: string, auth: Config['auth']): { userId: string; kind: OptionalKind } | null {
  try {
    const claims = jwt.verify(token, keyOf(auth), { algorithms: ['HS256'] });
    if (typeof claims !== 'object' || claims.purpose !== PURPOSE || typeof claims.sub !== 'string') return null;
    if (!Object.hasOwn(OPTIONAL_KINDS, claims.kind)) return null;
    return { userId: claims.sub, kind: claims.kind as OptionalKind };
  } catch {
    return null;
  }
}
