import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
const created = { created_at: { type: DataTypes.DATE, allowNull: false }, updated_at: { type: DataTypes.DATE, allowNull: false } };

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'drafts',
      {
        id,
        pattern_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'patterns', key: 'id' }, onDelete: 'CASCADE' },
        version: { type: DataTypes.INTEGER, allowNull: false },
        change_note: { type: DataTypes.TEXT, allowNull: false },
        created_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        ...created,
      },
      { transaction },
    );
    await qi.addConstraint('drafts', { type: 'unique', fields: ['pattern_id', 'version'], name: 'drafts_pattern_version', transaction });
    await qi.createTable(
      'draft_files',
      {
        id,
        draft_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'drafts', key: 'id' }, onDelete: 'CASCADE' },
        kind: { type: DataTypes.STRING(24), allowNull: false },
        original_name: { type: DataTypes.STRING(200), allowNull: false },
        // An opaque key: names in the store say nothing about the pattern or the studio.
        object_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        ...created,
      },
      { transaction },
    );
    await qi.createTable(
      'draft_downloads',
      {
        id,
        draft_file_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'draft_files', key: 'id' }, onDelete: 'CASCADE' },
        user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        ...created,
      },
      { transaction },
    );
    await qi.addIndex('draft_downloads', ['draft_file_id', 'user_id'], { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('draft_downloads', { transaction });
    await qi.dropTable('draft_files', { transaction });
    await qi.dropTable('drafts', { transaction });
  });
};
