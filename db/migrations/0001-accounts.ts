import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const id = {
  type: DataTypes.UUID,
  primaryKey: true,
  allowNull: false,
  defaultValue: DataTypes.UUIDV4,
};
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'users',
      {
        id,
        email: { type: DataTypes.STRING(254), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        password_hash: { type: DataTypes.STRING(100), allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    // E-mail addresses are compared without regard to case.
    await qi.sequelize.query('CREATE UNIQUE INDEX users_email_lower ON users (lower(email))', { transaction });

    await qi.createTable(
      'studios',
      {
        id,
        name: { type: DataTypes.STRING(120), allowNull: false },
        slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        time_zone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        ...timestamps,
      },
      { transaction },
    );

    await qi.createTable(
      'memberships',
      {
        id,
        studio_id: {
          type: DataTypes.UUID,
          allowNull: false,
          references: { model: 'studios', key: 'id' },
          onDelete: 'CASCADE',
        },
        user_id: {
          type: DataTypes.UUID,
          allowNull: false,
          references: { model: 'users', key: 'id' },
          onDelete: 'CASCADE',
        },
        role: { type: DataTypes.STRING(20), allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('memberships', {
      type: 'unique',
      fields: ['studio_id', 'user_id'],
      name: 'memberships_studio_user',
      transaction,
    });
    await qi.sequelize.query(
      "ALTER TABLE memberships ADD CONSTRAINT memberships_role CHECK (role IN ('owner','coordinator','grader','tester'))",
      { transaction },
    );
    await qi.addIndex('memberships', ['user_id'], { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('memberships', { transaction });
    await qi.dropTable('studios', { transaction });
    await qi.dropTable('users', { transaction });
  });
};
