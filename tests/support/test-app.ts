import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import { createSequelize } from '../../db/sequelize';
import { createApp } from '../../server/app';
import { settleBackgroundWork } from '../../server/background';
import { createLogger, type Logger } from '../../server/logger';
import { loadConfig, type Config } from '../../server/config';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { createStorage, type Storage } from '../../server/storage/storage';

export type TestApp = {
  app: Express;
  config: Config;
  sequelize: Sequelize;
  storage: Storage;
  mailer: Mailer;
  close(): Promise<void>;
};

// One pool per test file for the run's database, shared by every app the file builds: the
// models are bound to a single Sequelize instance (see db/sequelize.ts).
let shared: { sequelize: Sequelize; users: number } | undefined;

function acquireSequelize(url: string): { sequelize: Sequelize; release(): Promise<void> } {
  if (url !== process.env.DATABASE_URL) {
    // Another database (e.g. one that is down): its own pool, models left alone.
    const sequelize = createSequelize(url, { poolMax: 2, registerModels: false });
    return { sequelize, release: () => sequelize.close() };
  }
  shared ??= { sequelize: createSequelize(url, { poolMax: 5 }), users: 0 };
  shared.users += 1;
  const mine = shared;
  return {
    sequelize: mine.sequelize,
    async release() {
      mine.users -= 1;
      if (mine.users === 0) {
        shared = undefined;
        await mine.sequelize.close();
      }
    },
  };
}

/**
 * The real app against the run's own database and the running local fakes, built exactly as
 * server/index.ts builds it. `env` overrides single variables (e.g. a dead SMTP port); `extra.logger`
 * receives the app's log (silent by default).
 */
export function buildTestApp(env: Record<string, string> = {}, extra: { logger?: Logger } = {}): TestApp {
  const config = loadConfig({ ...process.env, ...env });
  const { sequelize, release } = acquireSequelize(config.databaseUrl);
  const storage = createStorage(config.s3);
  const mailer = createMailer(config.smtp);
  // Failures are logged as the server logs them; quiet unless a test reads them.
  const logger = extra.logger ?? createLogger({ level: 'silent' });
  const app = createApp({ config, sequelize, storage, mailer, logger });
  return {
    app,
    config,
    sequelize,
    storage,
    mailer,
    async close() {
      // Work that requests go on with after answering (sign-up, reset mail) ends first.
      await settleBackgroundWork();
      storage.close();
      mailer.close();
      await release();
    },
  };
}
