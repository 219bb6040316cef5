import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import { createSequelize } from '../../db/sequelize';
import { createApp } from '../../server/app';
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

/**
 * The real app against the run's own database and the running local fakes, built exactly as
 * server/index.ts builds it. `env` overrides single variables (e.g. a dead SMTP port).
 */
export function buildTestApp(env: Record<string, string> = {}): TestApp {
  const config = loadConfig({ ...process.env, ...env });
  const sequelize = createSequelize(config.databaseUrl, { poolMax: 5 });
  const storage = createStorage(config.s3);
  const mailer = createMailer(config.smtp);
  const app = createApp({ config, sequelize, storage, mailer });
  return {
    app,
    config,
    sequelize,
    storage,
    mailer,
    async close() {
      storage.close();
      mailer.close();
      await sequelize.close();
    },
  };
}
