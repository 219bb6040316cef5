import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'photos',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        enrollment_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'enrollments', key: 'id' }, onDelete: 'CASCADE' },
        // Which report the photo belongs to, and what it shows.
        stage: { type: DataTypes.STRING(12), allowNull: false },
        view: { type: DataTypes.STRING(12), allowNull: false },
        consent: { type: DataTypes.STRING(12), allowNull: false },
        full_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        thumb_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        created_at: { type: DataTypes.DATE, allowNull: false },
        updated_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.sequelize.query(
      "ALTER TABLE photos ADD CONSTRAINT photos_stage CHECK (stage IN ('check-in','final')), " +
        "ADD CONSTRAINT photos_view CHECK (view IN ('front','side','back','detail')), " +
        "ADD CONSTRAINT photos_consent CHECK (consent IN ('staff-only','may-share'))",
      { transaction },
    );
    await qi.addIndex('photos', ['enrollment_id'], { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.dropTable('photos');
};
