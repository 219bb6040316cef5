import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // A signed-out session: its token is refused by every instance until the token would have
    // expired anyway, after which the row is pruned.
    await qi.createTable(
      'revoked_sessions',
      {
        session_id: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        user_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        created_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.addIndex('revoked_sessions', ['expires_at'], { transaction });

    // When the address was shown to reach its owner (the link in the confirmation e-mail).
    await qi.addColumn('users', 'email_verified_at', { type: DataTypes.DATE, allowNull: true }, { transaction });
    // Accounts made before addresses were confirmed keep working as they did: each could already
    // sign in, and the one thing a confirmed address gates (accepting an invitation) checked the
    // address already.
    await qi.sequelize.query('UPDATE users SET email_verified_at = created_at', { transaction });

    // A sign-up waiting for its address to be confirmed: the account is made only from the link.
    await qi.createTable(
      'sign_up_requests',
      {
        id: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        password_hash: { type: DataTypes.STRING(100), allowNull: false },
        // Where the app goes after the link (e.g. back to an invitation); a path on our own site.
        next_path: { type: DataTypes.STRING(300), allowNull: true },
        // The account's time zone, as the sign-up form found it on the device.
        time_zone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        used_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.sequelize.query('CREATE INDEX sign_up_requests_email ON sign_up_requests (lower(email))', { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('sign_up_requests', { transaction });
    await qi.removeColumn('users', 'email_verified_at', { transaction });
    await qi.dropTable('revoked_sessions', { transaction });
  });
};
