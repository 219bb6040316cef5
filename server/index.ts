import { fork, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import type { Server } from 'node:http';
import path from 'node:path';
import { createSequelize } from '../db/sequelize';
import { migrateUp } from '../db/migrator';
import { createApp } from './app';
import { settleBackgroundWork } from './background';
import { ConfigError, loadConfig } from './config';
import { startJobSender } from './jobs/queue';
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
  // Reminders, digests, mail retries and findings recomputations run from the persistent queue in
  // PostgreSQL, in a worker process of their own (server/worker.ts); this process only sends jobs.
  const jobs = await startJobSender({ databaseUrl: config.databaseUrl });
  let closing = false;
  let worker: ChildProcess | null = null;
  const startWorker = () => {
    // Beside this file: worker.js in the built bundle, worker.ts under tsx (execArgv carries --import tsx).
    const file = [path.join(__dirname, 'worker.js'), path.join(__dirname, 'worker.ts')].find((f) => existsSync(f))!;
    worker = fork(file, [], { stdio: 'inherit' });
    worker.on('exit', (code) => {
      if (closing) return;
      console.error(`[jobs] worker stopped (${code}); starting it again in 5 s`);
      setTimeout(() => !closing && startWorker(), 5000).unref();
    });
  };
  startWorker();

  const server: Server = app.listen(config.port, config.host, () => {
    console.log(`Basted listening on http://${config.host}:${config.port}`);
  });

  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    worker?.kill('SIGTERM');
    console.log(`${signal}: closing`);
    // Let requests in flight finish, then release the pool; give up after 10 s.
    setTimeout(() => process.exit(1), 10_000).unref();
    server.close(() => {
      settleBackgroundWork()
        .then(() => jobs.stop())
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
