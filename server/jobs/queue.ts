import { Client } from 'pg';
import PgBoss from 'pg-boss';
import type { Sequelize } from 'sequelize';
import type { OutboxDeps } from '../outbox/outbox.service';
import { purgeDeletions } from '../storage/object-deletions';
import type { Storage } from '../storage/storage';
import { flushOutbox } from '../outbox/outbox.service';
import { sweepPhotoRetention } from './photo-retention';
import { startFindingsWorker, stopFindingsWorker, registerFindingsSender } from '../findings/findings-jobs';
import { runMailTick } from './tick';

// Any fixed number, the same for every Basted process (the migrations use another).
const JOB_SETUP_LOCK = 4_227_302;

/** Queue names. The jobs carry no data: the outbox and the reminder rules live in our tables. */
export const MAIL_TICK_QUEUE = 'mail-tick';
export const OUTBOX_FLUSH_QUEUE = 'outbox-flush';
export const PHOTO_RETENTION_QUEUE = 'photo-retention';

export type JobQueue = {
  boss: PgBoss;
  stop(): Promise<void>;
};

export type JobQueueOptions = {
  databaseUrl: string;
  /** Cron for the reminder and digest sweep; every 5 minutes keeps "08:00" within 08:05. */
  tickCron?: string;
  /** Cron for retries of failed sends. */
  flushCron?: string;
  /** Cron for removing photos past the studio's keeping period (daily, at night). */
  retentionCron?: string;
  /** Set false in tests that drive the clock themselves. */
  schedule?: boolean;
  /** Log each tick that did something (on by default). */
  log?: boolean;
};

/**
 * pg-boss in its own schema of our database: the schedules and jobs survive a restart, and
 * with several instances each cron slot runs once (pg-boss de-duplicates schedules, and the
 * outbox claims rows under SKIP LOCKED, so even two runs at once send nothing twice).
 */
export async function startJobQueue(deps: OutboxDeps & { storage?: Storage; sequelize?: Sequelize }, options: JobQueueOptions): Promise<JobQueue> {
  const boss = new PgBoss({ connectionString: options.databaseUrl, schema: 'pgboss', max: 3, application_name: 'basted-jobs' });
  boss.on('error', (error: unknown) => console.error('[jobs]', error));
  // Instances starting together would create the same queues at once, which deadlocks in
  // PostgreSQL (seen with two servers booting on a fresh database): one at a time, under a lock.
  const setupLock = new Client({ connectionString: options.databaseUrl, application_name: 'basted-jobs-setup' });
  await setupLock.connect();
  try {
    await setupLock.query('SELECT pg_advisory_lock($1)', [JOB_SETUP_LOCK]);
    await boss.start();
    await boss.createQueue(MAIL_TICK_QUEUE, { name: MAIL_TICK_QUEUE, policy: 'singleton', retryLimit: 2, retryDelay: 30, expireInSeconds: 600 });
    await boss.createQueue(OUTBOX_FLUSH_QUEUE, { name: OUTBOX_FLUSH_QUEUE, policy: 'singleton', retryLimit: 2, retryDelay: 30, expireInSeconds: 600 });
    await boss.createQueue(PHOTO_RETENTION_QUEUE, { name: PHOTO_RETENTION_QUEUE, policy: 'singleton', retryLimit: 2, retryDelay: 300, expireInSeconds: 3600 });
    if (options.schedule !== false) {
      await boss.schedule(MAIL_TICK_QUEUE, options.tickCron ?? '*/5 * * * *');
      await boss.schedule(OUTBOX_FLUSH_QUEUE, options.flushCron ?? '* * * * *');
      if (deps.storage) await boss.schedule(PHOTO_RETENTION_QUEUE, options.retentionCron ?? '17 3 * * *');
    }
  } finally {
    // Ending the session releases the lock even if the unlock itself fails.
    await setupLock.query('SELECT pg_advisory_unlock($1)', [JOB_SETUP_LOCK]).catch(() => undefined);
    await setupLock.end();
  }
  await boss.work(MAIL_TICK_QUEUE, async () => {
    const result = await runMailTick(deps, new Date());
    if (options.log !== false && (result.reminders.queued || result.digests.queued || result.delivered.length)) console.log('[jobs] mail tick', JSON.stringify(result));
  });
  await boss.work(OUTBOX_FLUSH_QUEUE, async () => {
    await flushOutbox(deps, new Date());
    // Stored objects whose rows are gone, left over while the file store was down.
    if (deps.storage && deps.sequelize) await purgeDeletions(deps.sequelize, deps.storage);
  });
  const storage = deps.storage;
  if (storage) {
    await boss.work(PHOTO_RETENTION_QUEUE, async () => {
      const result = await sweepPhotoRetention(storage, new Date());
      if (options.log !== false && (result.photos || result.failed)) console.log('[jobs] photo retention', JSON.stringify(result));
    });
  }
  // Findings are recomputed here, debounced per trial, rather than inside a tester's submission.
  await startFindingsWorker(boss);
  return {
    boss,
    async stop() {
      stopFindingsWorker();
      await boss.stop({ graceful: true, timeout: 8_000 });
    },
  };
}

/**
 * The API process's end of the queue: sends jobs (the findings recomputations after a submission)
 * and runs no worker and no schedule, so no sweep ever shares the event loop that answers
 * requests. The jobs run in the worker process (server/worker.ts).
 */
export async function startJobSender(options: { databaseUrl: string }): Promise<JobQueue> {
  const boss = new PgBoss({ connectionString: options.databaseUrl, schema: 'pgboss', max: 2, application_name: 'basted-api', supervise: false, schedule: false });
  boss.on('error', (error: unknown) => console.error('[jobs]', error));
  await boss.start();
  await registerFindingsSender(boss);
  return {
    boss,
    async stop() {
      stopFindingsWorker();
      await boss.stop({ graceful: true, timeout: 8_000 });
    },
  };
}
