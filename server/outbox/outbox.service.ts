import { randomUUID } from 'node:crypto';
import { literal, Op, QueryTypes, type Transaction } from 'sequelize';
import { OutboxMessage, User } from '../../db/models';
import type { MailCategory } from '../../db/models/outbox-message';
import type { Config } from '../config';
import { conflict, notFound } from '../errors';
import { reminderObsolete, remindersObsolete } from '../jobs/reminder-state';
import type { Mailer } from '../mail/mailer';
import { isOptional, OPTIONAL_KINDS, optOutUrl, type OptionalKind } from '../mail/opt-out';
import type { MailContent, OptOut } from '../mail/templates';

export type OutboxDeps = { config: Config; mailer: Mailer };

/** A send that fails is tried again after these waits; after the last one it is marked failed. */
export const RETRY_MINUTES = [1, 5, 15, 60] as const;
export const MAX_ATTEMPTS = RETRY_MINUTES.length + 1;
/**
 * A message claimed longer ago than this was being sent by a process that stopped mid-send.
 * Whether it left is unknown, so it is marked failed (a person may resend it) rather than sent
 * again: never twice wins over at least once.
 */
export const STALE_CLAIM_MINUTES = 15;

export type NewMessage = {
  /** Unique per message that must go out once, e.g. `reminder:<enrollment>:<milestone>:<stage>:<due>`. */
  key: string;
  to: { id: string | null; email: string };
  template: string;
  category: MailCategory;
  content: MailContent;
  studioId?: string | null;
  trialId?: string | null;
  enrollmentId?: string | null;
  milestoneKind?: string | null;
  dueAt?: Date | null;
  /** The content holds a secret link (reset, invitation): one attempt, then the content is erased. */
  secret?: boolean;
  /** Extra mail headers, e.g. Reply-To: the studio's own address for a message people may answer. */
  headers?: Record<string, string>;
};

/**
 * The opt-out link for an optional kind of mail, to put into the content before it is rendered;
 * null for essential mail.
 */
export function optOutFor(config: Config, userId: string | null, category: MailCategory): OptOut | undefined {
  if (!userId || !isOptional(category)) return undefined;
  return { url: optOutUrl(config, userId, category), what: OPTIONAL_KINDS[category].what };
}

async function preferenceOff(userId: string | null, category: MailCategory, transaction?: Transaction): Promise<boolean> {
  if (!userId || !isOptional(category)) return false;
  const user = await User.findByPk(userId, { transaction });
  return Boolean(user && !user[OPTIONAL_KINDS[category as OptionalKind].field]);
}

const skippedReason = (category: MailCategory) => `Not sent: the recipient turned off ${isOptional(category) ? OPTIONAL_KINDS[category].label : 'this mail'}.`;

/**
 * Records a message in the outbox, once per key: a second call with the same key changes nothing
 * and returns null. A recipient who turned this kind of mail off gets a `skipped` row instead.
 */
export async function enqueue(
  deps: Pick<OutboxDeps, 'config'>,
  message: NewMessage,
  options: { now?: Date; transaction?: Transaction; preferenceOff?: boolean; reload?: boolean } = {},
): Promise<OutboxMessage | null> {
  const now = options.now ?? new Date();
  // A sweep that loaded the recipient already knows their choice: no lookup per message.
  const off = options.preferenceOff ?? (await preferenceOff(message.to.id, message.category, options.transaction));
  const optOut = optOutFor(deps.config, message.to.id, message.category);
  // RFC 8058 one-click unsubscribe headers, so mail programs can offer the same opt-out.
  const headers: Record<string, string> = {
    ...(message.headers ?? {}),
    ...(optOut ? { 'List-Unsubscribe': `<${optOut.url}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' } : {}),
  };
  const [rows] = await OutboxMessage.sequelize!.query(
    `INSERT INTO outbox_messages (id, idempotency_key, recipient_id, recipient_email, template, category, studio_id, trial_id,
       enrollment_id, milestone_kind, due_at, subject, text, html, headers, secret, status, attempts, next_attempt_at,
       last_error, created_at, updated_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17, 0, $18, $19, $18, $18)
     ON CONFLICT (idempotency_key) DO NOTHING
     RETURNING id`,
    {
      bind: [
        randomUUID(),
        message.key.slice(0, 200),
        message.to.id,
        message.to.email,
        message.template,
        message.category,
        message.studioId ?? null,
        message.trialId ?? null,
        message.enrollmentId ?? null,
        message.milestoneKind ?? null,
        message.dueAt ?? null,
        message.content.subject.slice(0, 300),
        message.content.text,
        message.content.html,
        JSON.stringify(headers),
        message.secret ?? false,
        off ? 'skipped' : 'queued',
        now,
        off ? skippedReason(message.category) : null,
      ],
      transaction: options.transaction,
    },
  );
  const id = (rows as { id: string }[])[0]?.id;
  if (!id) return null;
  // A sweep recording thousands only needs to know what became of each: no read back.
  if (options.reload === false) return OutboxMessage.build({ id, status: off ? 'skipped' : 'queued' } as never, { isNewRecord: false });
  return OutboxMessage.findByPk(id, { transaction: options.transaction });
}

function describeError(error: unknown): string {
  const text = error instanceof Error ? error.message : String(error);
  return text.slice(0, 1000) || 'unknown error';
}

/** What a batch of claimed rows needs to know before sending, read in a few queries for the whole batch. */
type Known = { off: Map<string, boolean>; obsolete: Map<string, string | null> };

async function knownFor(rows: OutboxMessage[]): Promise<Known> {
  const off = new Map<string, boolean>();
  const ids = [...new Set(rows.map((r) => r.recipientId).filter((id): id is string => Boolean(id)))];
  if (ids.length) {
    const users = await User.findAll({ where: { id: ids }, attributes: ['id', 'mailReminders', 'mailTrialNews', 'mailDigest'] });
    const byId = new Map(users.map((u) => [u.id, u]));
    for (const row of rows) {
      if (!row.recipientId || !isOptional(row.category)) continue;
      const user = byId.get(row.recipientId);
      off.set(row.id, Boolean(user && !user[OPTIONAL_KINDS[row.category as OptionalKind].field]));
    }
  }
  const obsolete = await remindersObsolete(rows.filter((r) => r.category === 'reminders' && r.enrollmentId));
  return { off, obsolete };
}

/**
 * Settles a claimed row: sent, skipped, cancelled, or back in the queue / failed after an error.
 * With `known` (a flush of a batch) the recipient's choice and the reminder's state come from the
 * batch's look-ups and the settled row is not read back.
 */
async function attempt(deps: OutboxDeps, row: OutboxMessage, now: Date, known?: Known): Promise<OutboxMessage> {
  const settle = async (fields: Partial<OutboxMessage>) => {
    await OutboxMessage.update({ ...fields, claimedAt: null }, { where: { id: row.id, status: 'sending' } });
    if (known) return row.set({ ...fields, claimedAt: null });
    return (await OutboxMessage.findByPk(row.id))!;
  };
  if (known ? known.off.get(row.id) : await preferenceOff(row.recipientId, row.category)) return settle({ status: 'skipped', lastError: skippedReason(row.category) });
  if (row.category === 'reminders' && row.enrollmentId) {
    const why = known ? (known.obsolete.get(row.id) ?? null) : await reminderObsolete(row);
    if (why) return settle({ status: 'cancelled', lastError: `Not sent: ${why}.` });
  }
  if (row.text === null) return settle({ status: 'failed', lastError: 'The content of this message is no longer kept.' });
  try {
    const sent = await deps.mailer.send({ to: row.recipientEmail, subject: row.subject, text: row.text, html: row.html ?? undefined, headers: row.headers });
    return settle({
      status: 'sent',
      sentAt: now,
      providerMessageId: sent.messageId?.slice(0, 300) ?? null,
      ...(row.secret ? { text: null, html: null } : {}),
    });
  } catch (error) {
    const lastError = describeError(error);
    if (row.secret || row.attempts >= MAX_ATTEMPTS) {
      return settle({ status: 'failed', lastError, ...(row.secret ? { text: null, html: null } : {}) });
    }
    const wait = RETRY_MINUTES[Math.min(row.attempts, RETRY_MINUTES.length) - 1];
    return settle({ status: 'queued', lastError, nextAttemptAt: new Date(now.getTime() + wait * 60_000) });
  }
}

/**
 * Claims queued rows atomically: the row lock with SKIP LOCKED means two workers never take the
 * same row, and only a row still `queued` can move to `sending`.
 */
async function claim(filter: { id?: string; now: Date; limit: number }): Promise<OutboxMessage[]> {
  const rows = await OutboxMessage.sequelize!.query<{ id: string }>(
    // claimed_at is the database's own clock, not the tick's: it measures how long a real process
    // has held the row (see failStaleClaims), whatever instant a hand-moved clock pretends it is.
    `UPDATE outbox_messages SET status = 'sending', attempts = attempts + 1, claimed_at = now(), updated_at = $1
     WHERE id IN (
       SELECT id FROM outbox_messages
       WHERE status = 'queued' AND ${filter.id ? 'id = $3' : 'next_attempt_at <= $1'}
       ORDER BY next_attempt_at
       LIMIT $2
       FOR UPDATE SKIP LOCKED)
     RETURNING id`,
    { bind: filter.id ? [filter.now, filter.limit, filter.id] : [filter.now, filter.limit], type: QueryTypes.SELECT },
  );
  if (rows.length === 0) return [];
  return OutboxMessage.findAll({ where: { id: rows.map((r) => r.id) } });
}

/** Tries one message now, if it is still queued (another worker may have taken it). */
export async function deliver(deps: OutboxDeps, id: string, now = new Date()): Promise<OutboxMessage | null> {
  const [row] = await claim({ id, now, limit: 1 });
  return row ? attempt(deps, row, now) : OutboxMessage.findByPk(id);
}

/** Records a message and tries it right away; a failure stays queued for the worker's retries. */
export async function send(deps: OutboxDeps, message: NewMessage, now = new Date()): Promise<OutboxMessage | null> {
  const row = await enqueue(deps, message, { now });
  if (!row || row.status !== 'queued') return row;
  return deliver(deps, row.id, now);
}

/**
 * For mail the caller cannot do without (a reset link, an invitation): recorded, tried once, and
 * an error thrown when it did not leave, so the caller can undo what it was for.
 */
export async function sendOrThrow(deps: OutboxDeps, message: Omit<NewMessage, 'category' | 'secret'>, now = new Date()): Promise<OutboxMessage> {
  const row = await send(deps, { ...message, category: 'essential', secret: true }, now);
  if (!row || row.status !== 'sent') throw new Error(`mail ${message.template} to ${message.to.email} not sent: ${row?.lastError ?? 'not recorded'}`);
  return row;
}

/**
 * Rows whose sender stopped mid-send: marked failed (see STALE_CLAIM_MINUTES). Measured on the
 * database's clock, so a tick with a hand-moved clock never fails a send still in progress.
 */
export async function failStaleClaims(): Promise<number> {
  const [count] = await OutboxMessage.update(
    { status: 'failed', lastError: 'The sending process stopped during delivery; it is unknown whether the message left. Resend it if needed.', claimedAt: null },
    { where: { status: 'sending', claimedAt: { [Op.lt]: literal(`now() - interval '${STALE_CLAIM_MINUTES} minutes'`) } } },
  );
  return count;
}

export type Settled = { id: string; to: string; template: string; subject: string; status: string; lastError: string | null };

/** Messages handed to the mail transport at once: enough to keep its pooled connections busy. */
export const OUTBOX_IN_FLIGHT = 10;

/**
 * Delivers every message that is due, in claimed batches, until none is left (no cap on rounds:
 * a due evening of thousands of reminders leaves nothing behind), with at most OUTBOX_IN_FLIGHT
 * messages in flight. A message that fails waits for its retry time, so it is not claimed again in
 * the same run. Says what became of each.
 */
export async function flushOutbox(deps: OutboxDeps, now = new Date(), batch = 100): Promise<Settled[]> {
  const settledRows: Settled[] = [];
  for (;;) {
    const rows = await claim({ now, limit: batch });
    if (rows.length === 0) break;
    const known = await knownFor(rows);
    let next = 0;
    const lane = async () => {
      while (next < rows.length) {
        const row = rows[next++];
        const s = await attempt(deps, row, now, known);
        settledRows.push({ id: s.id, to: s.recipientEmail, template: s.template, subject: s.subject, status: s.status, lastError: s.status === 'sent' ? null : s.lastError });
      }
    };
    await Promise.all(Array.from({ length: Math.min(OUTBOX_IN_FLIGHT, rows.length) }, lane));
  }
  return settledRows;
}

/**
 * Cancels queued reminders that should no longer go out (a submission, a withdrawal, a new date);
 * the sweep sends the ones for the new date when their morning comes.
 */
export async function cancelObsoleteReminders(scope: { enrollmentId?: string; trialId?: string }): Promise<number> {
  const where = { status: 'queued' as const, category: 'reminders' as const, ...(scope.enrollmentId ? { enrollmentId: scope.enrollmentId } : {}), ...(scope.trialId ? { trialId: scope.trialId } : {}) };
  if (!scope.enrollmentId && !scope.trialId) return 0;
  let cancelled = 0;
  for (const row of await OutboxMessage.findAll({ where })) {
    const why = await reminderObsolete(row);
    if (!why) continue;
    const [n] = await OutboxMessage.update({ status: 'cancelled', lastError: `Not sent: ${why}.` }, { where: { id: row.id, status: 'queued' } });
    cancelled += n;
  }
  return cancelled;
}

/** The messages of one trial, newest first, for its staff. */
export async function trialOutbox(trialId: string) {
  return OutboxMessage.findAll({
    where: { trialId },
    include: [{ model: User, as: 'recipient' }],
    order: [['createdAt', 'DESC']],
    limit: 300,
  });
}

/** Sends a failed message of the trial again, as a fresh round of attempts. */
export async function resend(deps: OutboxDeps, trialId: string, messageId: string, now = new Date()) {
  const row = await OutboxMessage.findOne({ where: { id: messageId, trialId } });
  if (!row) throw notFound('message');
  if (row.status !== 'failed') throw conflict(`Only a failed message can be sent again; this one is ${row.status}.`, { status: `is ${row.status}` });
  if (row.text === null) throw conflict('The content of this message is no longer kept, so it cannot be sent again.');
  await OutboxMessage.update({ status: 'queued', attempts: 0, nextAttemptAt: now }, { where: { id: row.id, status: 'failed' } });
  return (await deliver(deps, row.id, now))!;
}

export function serializeOutboxMessage(row: OutboxMessage) {
  return {
    id: row.id,
    to: { name: row.recipient?.name ?? null, email: row.recipientEmail },
    template: row.template,
    category: row.category,
    subject: row.subject,
    status: row.status,
    attempts: row.attempts,
    lastError: row.lastError,
    providerMessageId: row.providerMessageId,
    nextAttemptAt: row.status === 'queued' ? row.nextAttemptAt : null,
    sentAt: row.sentAt,
    createdAt: row.createdAt,
    canResend: row.status === 'failed' && row.text !== null,
  };
}
