import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const uuid = { type: DataTypes.UUID, allowNull: false };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // Settings every user has, staff and testers alike.
    await qi.addColumn('users', 'length_unit', { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' }, { transaction });
    await qi.addColumn('users', 'fabric_unit', { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'yd' }, { transaction });
    await qi.addColumn('users', 'time_zone', { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' }, { transaction });
    // Bumped by a password reset: every session issued before it stops working.
    await qi.addColumn('users', 'session_version', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }, { transaction });
    await qi.addColumn('users', 'current_studio_id', {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'studios', key: 'id' },
      onDelete: 'SET NULL',
    }, { transaction });
    await qi.addColumn('users', 'mail_reminders', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true }, { transaction });
    await qi.addColumn('users', 'mail_trial_news', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true }, { transaction });
    await qi.addColumn('users', 'mail_digest', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true }, { transaction });
    await qi.sequelize.query(
      "ALTER TABLE users ADD CONSTRAINT users_length_unit CHECK (length_unit IN ('in','cm')), " +
        "ADD CONSTRAINT users_fabric_unit CHECK (fabric_unit IN ('yd','m'))",
      { transaction },
    );

    // A tester's body profile: lengths in millimetres keyed by the measurement vocabulary.
    await qi.createTable(
      'tester_profiles',
      {
        user_id: { ...uuid, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        measurements_mm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        experience: { type: DataTypes.STRING(20), allowNull: true },
        fit_notes: { type: DataTypes.STRING(1000), allowNull: true },
        ...timestamps,
      },
      { transaction },
    );

    await qi.createTable(
      'password_resets',
      {
        id: { ...uuid, primaryKey: true },
        user_id: { ...uuid, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        // Only a hash is kept: a leaked table gives no usable link.
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        used_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );

    await qi.createTable(
      'invitations',
      {
        id: { ...uuid, primaryKey: true },
        studio_id: { ...uuid, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        invited_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        accepted_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
        revoked_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.sequelize.query(
      "ALTER TABLE invitations ADD CONSTRAINT invitations_role CHECK (role IN ('coordinator','grader','tester'))",
      { transaction },
    );
    // At most one open invitation per address and studio; a new one replaces the old.
    await qi.sequelize.query(
      'CREATE UNIQUE INDEX invitations_open_per_email ON invitations (studio_id, lower(email)) WHERE accepted_at IS NULL AND revoked_at IS NULL',
      { transaction },
    );
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('invitations', { transaction });
    await qi.dropTable('password_resets', { transaction });
    await qi.dropTable('tester_profiles', { transaction });
    await qi.sequelize.query('ALTER TABLE users DROP CONSTRAINT users_length_unit, DROP CONSTRAINT users_fabric_unit', { transaction });
    for (const column of ['mail_digest', 'mail_trial_news', 'mail_reminders', 'current_studio_id', 'session_version', 'time_zone', 'fabric_unit', 'length_unit']) {
      await qi.removeColumn('users', column, { transaction });
    }
  });
};
