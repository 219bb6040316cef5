import type { QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

/**
 * The counters of every rate limit, shared by all instances of the server. The columns are the
 * ones rate-limiter-flexible's PostgreSQL store reads and writes (key, points, expire in epoch
 * milliseconds); the store is told the table exists, so it never creates one itself.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query(
      `CREATE TABLE rate_limits (
         key varchar(255) PRIMARY KEY,
         points integer NOT NULL DEFAULT 0,
         expire bigint
       )`,
      { transaction },
    );
    await qi.sequelize.query('CREATE INDEX rate_limits_expire ON rate_limits (expire)', { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('rate_limits', { transaction });
  });
};
