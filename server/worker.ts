import { createSequelize } from '../db/sequelize';
import { ConfigError, loadConfig } from './config';
import { startJobQueue } from './jobs/queue';
import { createMailer } from './mail/mailer';
import { createStorage } from './storage/storage';

/**
 * The job worker: reminders and digests, mail retries and findings recomputations, in a process
 * of its own (started by server/index.ts), so a sweep of thousands of enrolments or a findings
 * computation never holds up the API's requests. Several of them (one per instance) share the
 * queue in PostgreSQL; each job runs once.
 */
async function main() {
  const config = loadConfig();
  const sequelize = createSequelize(config.databaseUrl, { poolMax: 4 });
  const mailer = createMailer(config.smtp);
  // The file store: stored objects left over while it was down, and photos past their keeping time.
  const storage = createStorage(config.s3);
  const jobs = await startJobQueue({ config, mailer, storage, sequelize }, { databaseUrl: config.databaseUrl });
  console.log('[jobs] worker running');
  let closing = false;
  const shutdown = () => {
    if (closing) return;
    closing = true;
    setTimeout(() => process.exit(1), 10_000).unref();
    jobs
      .stop()
      .catch((error: unknown) => console.error('[jobs] stop:', error))
      .finally(() => {
        mailer.close();
        storage.close();
        sequelize.close().finally(() => process.exit(0));
      });
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
  // The API process that started this one is gone: stop too.
  process.on('disconnect', shutdown);
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
});
