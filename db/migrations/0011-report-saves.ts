import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

/**
 * Each saved report carries a version, raised by every save: a save made from an older version
 * is refused (409) instead of overwriting what another window or device stored in between.
 * A final report also records which parts it took over from the tester's check-in when it was
 * started, so the form can say so.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn('reports', 'version', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }, { transaction });
    await qi.sequelize.query('ALTER TABLE reports ADD CONSTRAINT reports_version_not_negative CHECK (version >= 0)', { transaction });
    await qi.addColumn('reports', 'prefilled', { type: DataTypes.JSONB, allowNull: false, defaultValue: [] }, { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query('ALTER TABLE reports DROP CONSTRAINT IF EXISTS reports_version_not_negative', { transaction });
    await qi.removeColumn('reports', 'prefilled', { transaction });
    await qi.removeColumn('reports', 'version', { transaction });
  });
};
