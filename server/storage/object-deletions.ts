import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Bucket, Storage } from './storage';

export type StoredObject = { bucket: Bucket; key: string };

/** Waits before trying a failed removal again: 1, 5, 15 minutes, then every hour. */
const RETRY_MINUTES = [1, 5, 15, 60];

/**
 * Records objects to remove from the file store, in the caller's transaction: the rows that named
 * them and this record commit (or roll back) together, so nothing is left behind when the store
 * is down at that moment.
 */
export async function scheduleDeletions(sequelize: Sequelize, objects: StoredObject[], transaction: Transaction): Promise<void> {
  for (const o of objects) {
    await sequelize.query(
      `INSERT INTO object_deletions (id, bucket, object_key, attempts, next_attempt_at, created_at, updated_at)
       VALUES ($1, $2, $3, 0, now(), now(), now())
       ON CONFLICT (bucket, object_key) DO NOTHING`,
      { bind: [randomUUID(), o.bucket, o.key], transaction },
    );
  }
}

/**
 * Removes the recorded objects that are due, each row claimed under SKIP LOCKED so two instances
 * never work on the same one; a failure is kept with its reason and tried again later. Returns
 * how many were removed and how many are still waiting.
 */
export async function purgeDeletions(sequelize: Sequelize, storage: Storage, options: { now?: Date; limit?: number } = {}): Promise<{ removed: number; waiting: number }> {
  const now = options.now ?? new Date();
  let removed = 0;
  await sequelize.transaction(async (transaction) => {
    const rows = await sequelize.query<{ id: string; bucket: Bucket; object_key: string; attempts: number }>(
      `SELECT id, bucket, object_key, attempts FROM object_deletions WHERE next_attempt_at <= $1
       ORDER BY next_attempt_at LIMIT $2 FOR UPDATE SKIP LOCKED`,
      { bind: [now, options.limit ?? 200], type: QueryTypes.SELECT, transaction },
    );
    for (const row of rows) {
      try {
        await storage.remove(row.bucket, row.object_key);
        await sequelize.query('DELETE FROM object_deletions WHERE id = $1', { bind: [row.id], transaction });
        removed += 1;
      } catch (error) {
        const wait = RETRY_MINUTES[Math.min(row.attempts, RETRY_MINUTES.length - 1)]!;
        await sequelize.query(
          `UPDATE object_deletions SET attempts = attempts + 1, last_error = $2, next_attempt_at = $3, updated_at = now() WHERE id = $1`,
          { bind: [row.id, (error instanceof Error ? error.message : String(error)).slice(0, 500), new Date(now.getTime() + wait * 60_000)], transaction },
        );
        // The store is most likely down: the rest wait for the next run rather than each time out.
        break;
      }
    }
  });
  const [{ waiting }] = await sequelize.query<{ waiting: string }>('SELECT count(*) AS waiting FROM object_deletions', { type: QueryTypes.SELECT });
  return { removed, waiting: Number(waiting) };
}

/** purgeDeletions right after a change, without letting a store outage fail the request. */
export async function purgeSoon(sequelize: Sequelize, storage: Storage): Promise<void> {
  try {
    await purgeDeletions(sequelize, storage);
  } catch (error) {
    console.error('[storage] removing deleted objects:', error instanceof Error ? error.message : error);
  }
}
