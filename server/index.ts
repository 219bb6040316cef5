import type { Server } from 'node:http';
import { createSequelize } from '../db/sequelize';
import { migrateUp } from '../db/migrator';
import { createApp } from './app';
import { ConfigError, loadConfig } from './config';
import { startJobQueue } from './jobs/queue';
import { createMailer } from './mail/mailer';
import { createStorage } from './storage/storage';

async function main() {
  const config = loadConfig();
  const sequelize = createSequelize(config.databaseUrl, { poolMax: config.databasePoolMax });
  // Pending migrations run at every boot, under a lock, so a restarted or second instance
  // needs no manual step.
  await migrateUp(sequelize);
  const storage = createStorage(config.s3);
  const mailer = createMailer(config.smtp);
  const app = createApp({ config, sequelize, storage, mailer });
  // Reminders, digests and mail retries run from the persistent queue in PostgreSQL.
  const jobs = await startJobQueue({ config, mailer, storage }, { databaseUrl: config.databaseUrl });

  const server: Server = app.listen(config.port, config.host, () => {
    console.log(`Basted listening on http://${config.host}:${config.port}`);
  });

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`${signal}: closing`);
    // Let requests in flight finish, then release the pool; give up after 10 s.
    setTimeout(() => process.exit(1), 10_000).unref();
    server.close(() => {
      jobs
        .stop()
        .catch((error: unknown) => console.error('[jobs] stop:', error))
        .finally(() => {
          storage.close();
          mailer.close();
          sequelize.close().finally(() => process.exit(0));
        });
    });
    server.closeIdleConnections();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
});
