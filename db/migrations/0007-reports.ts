import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'reports',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        enrollment_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'enrollments', key: 'id' }, onDelete: 'CASCADE' },
        stage: { type: DataTypes.STRING(12), allowNull: false },
        // Everything the tester entered, saved as they go (see server/domain/schemas/reports.ts).
        content: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        submitted_at: { type: DataTypes.DATE, allowNull: true },
        created_at: { type: DataTypes.DATE, allowNull: false },
        updated_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.addConstraint('reports', { type: 'unique', fields: ['enrollment_id', 'stage'], name: 'reports_one_per_stage', transaction });
    await qi.sequelize.query("ALTER TABLE reports ADD CONSTRAINT reports_stage CHECK (stage IN ('check-in','final'))", { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.dropTable('reports');
};
