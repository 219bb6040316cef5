import type { OutboxDeps, Settled } from '../outbox/outbox.service';
import { failStaleClaims, flushOutbox } from '../outbox/outbox.service';
import { activeEnrollments, sweepDigests, sweepReminders } from './reminders';

export type TickResult = {
  at: string;
  staleFailed: number;
  reminders: { queued: number; skipped: number };
  digests: { queued: number; skipped: number };
  /** Every message this pass tried to deliver (new ones and retries), with its outcome. */
  delivered: Settled[];
};

/**
 * One pass of the mail clock as of `now`: records the reminders and digests due then, and
 * delivers every queued message whose time has come (retries included). The queue runs it on a
 * schedule; tests and `npm run mail:tick` run it with a clock of their choosing.
 */
export async function runMailTick(deps: OutboxDeps, now: Date = new Date()): Promise<TickResult> {
  const staleFailed = await failStaleClaims();
  // One load of the active enrolments serves both sweeps.
  const loaded = await activeEnrollments(now);
  const reminders = await sweepReminders(deps.config, now, loaded);
  const digests = await sweepDigests(deps.config, now, loaded);
  const delivered = await flushOutbox(deps, now);
  return { at: now.toISOString(), staleFailed, reminders, digests, delivered };
}
