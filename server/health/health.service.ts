import type { Sequelize } from 'sequelize';
import type { Mailer } from '../mail/mailer';
import type { Storage } from '../storage/storage';

export type ComponentState = { ok: true; ms: number } | { ok: false; ms: number; error: string };
export type Health = {
  status: 'ok' | 'degraded';
  database: ComponentState;
  storage: ComponentState;
  mail: ComponentState;
};

async function probe(check: () => Promise<unknown>): Promise<ComponentState> {
  const started = Date.now();
  try {
    await check();
    return { ok: true, ms: Date.now() - started };
  } catch (error) {
    const message = error instanceof Error ? error.message || error.name : String(error);
    return { ok: false, ms: Date.now() - started, error: message };
  }
}

export async function checkHealth(deps: { sequelize: Sequelize; storage: Storage; mailer: Mailer }): Promise<Health> {
  const [database, storage, mail] = await Promise.all([
    probe(() => deps.sequelize.query('SELECT 1')),
    probe(() => deps.storage.check()),
    probe(() => deps.mailer.check()),
  ]);
  return { status: database.ok && storage.ok && mail.ok ? 'ok' : 'degraded', database, storage, mail };
}
