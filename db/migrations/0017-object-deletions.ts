import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

/**
 * Stored objects whose rows are gone (a withdrawn tester's photos, a deleted studio's files) and
 * which the file store still holds. They are recorded in the same transaction that removes the
 * rows, so a store that is down at that moment loses nothing: a job removes them once it answers.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'object_deletions',
      {
        id: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        bucket: { type: DataTypes.STRING(20), allowNull: false },
        object_key: { type: DataTypes.STRING(300), allowNull: false },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        last_error: { type: DataTypes.STRING(500), allowNull: true },
        next_attempt_at: { type: DataTypes.DATE, allowNull: false },
        created_at: { type: DataTypes.DATE, allowNull: false },
        updated_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.addConstraint('object_deletions', { type: 'unique', fields: ['bucket', 'object_key'], name: 'object_deletions_object', transaction });
    await qi.addIndex('object_deletions', ['next_attempt_at'], { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('object_deletions', { transaction });
  });
};
