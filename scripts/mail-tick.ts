// `npm run -s mail:tick -- [--at 2026-12-03T08:05:00Z]`
// Runs the mail clock once as of the given instant (default: now) against the configured
// database and SMTP server: records the reminders and digests due then and delivers every
// queued message whose time has come. Prints what happened as JSON on stdout; bad arguments
// go to stderr with exit code 2. Safe to run again or alongside the server: nothing is sent twice.
import { migrateUp } from '../db/migrator';
import { createSequelize } from '../db/sequelize';
import { ConfigError, loadConfig } from '../server/config';
import { runMailTick } from '../server/jobs/tick';
import { createMailer } from '../server/mail/mailer';

const USAGE = 'usage: npm run -s mail:tick -- [--at ISO-8601 instant, e.g. 2026-12-03T08:05:00Z]';

function parseAt(argv: string[]): Date {
  let at: Date | undefined;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg === '--at') {
      const value = argv[++i];
      // An explicit offset is required: a bare local time would mean a different instant per machine.
      if (!value || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/.test(value) || Number.isNaN(Date.parse(value))) {
        throw new Error(`--at needs an instant with its offset, e.g. 2026-12-03T08:05:00Z (got ${value ?? 'nothing'})`);
      }
      at = new Date(value);
    } else if (arg === '--help' || arg === '-h') {
      throw new Error('');
    } else {
      throw new Error(`unknown argument ${arg}`);
    }
  }
  return at ?? new Date();
}

async function main() {
  let at: Date;
  try {
    at = parseAt(process.argv.slice(2));
  } catch (error) {
    const message = (error as Error).message;
    console.error(message ? `${message}\n${USAGE}` : USAGE);
    process.exit(2);
  }
  const config = loadConfig();
  const sequelize = createSequelize(config.databaseUrl, { poolMax: 3 });
  const mailer = createMailer(config.smtp);
  try {
    // Like the server at boot: a database not yet migrated to the outbox is brought up to date.
    await migrateUp(sequelize);
    const result = await runMailTick({ config, mailer }, at);
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
  } finally {
    mailer.close();
    await sequelize.close();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
});
