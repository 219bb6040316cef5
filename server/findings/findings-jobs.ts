import type PgBoss from 'pg-boss';
import { QueryTypes } from 'sequelize';
import { Trial } from '../../db/models';
import { refreshFindings } from './findings.service';

/** The queue of findings recomputations: one job per trial, run by any instance's worker. */
export const FINDINGS_QUEUE = 'findings-refresh';
/**
 * A submission waits this long before its trial's findings are computed again, so a burst of
 * submissions (a due evening) costs one recomputation per trial every few seconds, not one each.
 */
export const FINDINGS_DEBOUNCE_SECONDS = 3;

let queue: PgBoss | null = null;
/** When this process last queued a trial's recomputation (a job it knows is still waiting). */
const sentAt = new Map<string, number>();

/**
 * Starts this process's findings worker on the job queue. The queue's "stately" policy keeps at
 * most one waiting and one running job per trial (the singleton key), so every submission during
 * the wait joins the job already waiting, and a submission during a run queues exactly one more.
 */
export async function startFindingsWorker(boss: PgBoss, options: { pollingIntervalSeconds?: number } = {}): Promise<void> {
  await boss.createQueue(FINDINGS_QUEUE, { name: FINDINGS_QUEUE, policy: 'stately', retryLimit: 3, retryDelay: 5, expireInSeconds: 300 });
  await boss.work<{ trialId: string }>(FINDINGS_QUEUE, { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 }, async (jobs) => {
    for (const job of jobs) {
      const trial = await Trial.findByPk(job.data.trialId, { attributes: ['id', 'patternId', 'studioId'] });
      if (trial) await refreshFindings(trial);
    }
  });
  queue = boss;
}

/**
 * In a process that runs no worker (the API when the jobs run in their own process): sends the
 * recomputations to the queue, where the worker process picks them up.
 */
export async function registerFindingsSender(boss: PgBoss): Promise<void> {
  await boss.createQueue(FINDINGS_QUEUE, { name: FINDINGS_QUEUE, policy: 'stately', retryLimit: 3, retryDelay: 5, expireInSeconds: 300 });
  queue = boss;
}

export function stopFindingsWorker(): void {
  queue = null;
  sentAt.clear();
}

/**
 * After a write the findings depend on (the database has already bumped the trial's revision):
 * with a job queue in this process, schedules the trial's debounced recomputation and returns at
 * once; without one (a script, a test that builds the app alone) recomputes right here, as a
 * failure to recompute must never be the tester's problem, it is logged and not thrown.
 */
export async function scheduleFindingsRefresh(trialId: string): Promise<void> {
  try {
    if (queue) {
      // A job this process queued less than the debounce ago has not started yet (it waits the
      // whole debounce), so it will read this write too: no need to ask the queue again.
      const sent = sentAt.get(trialId);
      if (sent !== undefined && Date.now() - sent < (FINDINGS_DEBOUNCE_SECONDS - 1) * 1000) return;
      const id = await queue.send(FINDINGS_QUEUE, { trialId }, { singletonKey: trialId, startAfter: FINDINGS_DEBOUNCE_SECONDS });
      if (id) {
        if (sentAt.size > 10_000) sentAt.clear();
        sentAt.set(trialId, Date.now());
      }
      return;
    }
    const trial = await Trial.findByPk(trialId, { attributes: ['id', 'patternId', 'studioId'] });
    if (trial) await refreshFindings(trial);
  } catch (error) {
    console.error('[findings] could not schedule a recomputation', trialId, error instanceof Error ? error.message : error);
  }
}

/** Whether a recomputation of the trial's findings is waiting or running on the job queue. */
export async function refreshQueued(trialId: string): Promise<boolean> {
  if (!queue) return false;
  const rows = await Trial.sequelize!.query(
    `SELECT 1 FROM pgboss.job WHERE name = $1 AND singleton_key = $2 AND state IN ('created', 'retry', 'active') LIMIT 1`,
    { bind: [FINDINGS_QUEUE, trialId], type: QueryTypes.SELECT },
  );
  return rows.length > 0;
}
