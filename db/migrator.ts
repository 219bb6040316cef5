import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { migrations } from './migrations';

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up({ context, name: m.name }),
      down: ({ context }) => m.down({ context, name: m.name }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

// Any fixed number works; it only has to be the same for every Basted process.
const MIGRATION_LOCK = 4_227_301;

/**
 * Applies pending migrations while holding a transaction-scoped advisory lock, so two
 * processes starting together never run the same migration twice.
 */
export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
  const migrator = createMigrator(sequelize);
  return sequelize.transaction(async (transaction) => {
    await sequelize.query('SELECT pg_advisory_xact_lock(:key)', { replacements: { key: MIGRATION_LOCK }, transaction });
    const applied = await migrator.up();
    return applied.map((m) => m.name);
  });
}

/** Undoes every migration (used by db:reset and tests of the down migrations). */
export async function migrateDownAll(sequelize: Sequelize): Promise<string[]> {
  const reverted = await createMigrator(sequelize).down({ to: 0 });
  return reverted.map((m) => m.name);
}
