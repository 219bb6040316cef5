import type { Sequelize } from 'sequelize';
import type { Mailer } from '../mail/mailer';
import type { Storage } from '../storage/storage';
import { describeError, type Logger } from '../logger';

/** What the public health answer says of a part: up or down and how long it took — no address or reason. */
export type ComponentState = { ok: true; ms: number } | { ok: false; ms: number; error: 'not answering' };
export type Health = {
  status: 'ok' | 'degraded';
  database: ComponentState;
  storage: ComponentState;
  mail: ComponentState;
};

/**
 * Runs one check. The reason of a failure names internal hosts and ports, so it goes to the log
 * for the operators, not into the answer anyone can read.
 */
async function probe(part: string, check: () => Promise<unknown>, logger?: Logger): Promise<ComponentState> {
  const started = Date.now();
  try {
    await check();
    return { ok: true, ms: Date.now() - started };
  } catch (error) {
    logger?.warn({ part, err: describeError(error) }, 'health check failed');
    return { ok: false, ms: Date.now() - started, error: 'not answering' };
  }
}

export async function checkHealth(deps: { sequelize: Sequelize; storage: Storage; mailer: Mailer; logger?: Logger }): Promise<Health> {
  const [database, storage, mail] = await Promise.all([
    probe('database', () => deps.sequelize.query('SELECT 1'), deps.logger),
    probe('storage', () => deps.storage.check(), deps.logger),
    probe('mail', () => deps.mailer.check(), deps.logger),
  ]);
  return { status: database.ok && storage.ok && mail.ok ? 'ok' : 'degraded', database, storage, mail };
}
