import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // Links to what a message is about are kept loose: the record of a message outlives them.
    const link = (table: string) => ({ type: DataTypes.UUID, allowNull: true, references: { model: table, key: 'id' }, onDelete: 'SET NULL' });
    await qi.createTable(
      'outbox_messages',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        // One row per message that must go out once: a second enqueue with the same key is a no-op.
        idempotency_key: { type: DataTypes.STRING(200), allowNull: false, unique: true },
        recipient_id: link('users'),
        recipient_email: { type: DataTypes.STRING(254), allowNull: false },
        template: { type: DataTypes.STRING(32), allowNull: false },
        category: { type: DataTypes.STRING(16), allowNull: false },
        studio_id: link('studios'),
        trial_id: link('trials'),
        enrollment_id: link('enrollments'),
        milestone_kind: { type: DataTypes.STRING(24), allowNull: true },
        due_at: { type: DataTypes.DATE, allowNull: true },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        // Null once a message carrying a secret link has had its one attempt.
        text: { type: DataTypes.TEXT, allowNull: true },
        html: { type: DataTypes.TEXT, allowNull: true },
        headers: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        // The content holds a secret link (reset, invitation): one attempt, then it is erased.
        secret: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'queued' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        next_attempt_at: { type: DataTypes.DATE, allowNull: false },
        claimed_at: { type: DataTypes.DATE, allowNull: true },
        last_error: { type: DataTypes.TEXT, allowNull: true },
        provider_message_id: { type: DataTypes.STRING(300), allowNull: true },
        sent_at: { type: DataTypes.DATE, allowNull: true },
        created_at: { type: DataTypes.DATE, allowNull: false },
        updated_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.sequelize.query(
      "ALTER TABLE outbox_messages ADD CONSTRAINT outbox_messages_status CHECK (status IN ('queued','sending','sent','failed','skipped','cancelled')), " +
        "ADD CONSTRAINT outbox_messages_category CHECK (category IN ('essential','trial-news','reminders','digest'))",
      { transaction },
    );
    // The delivery worker's scan, and the Mail screen's list per trial.
    await qi.addIndex('outbox_messages', ['status', 'next_attempt_at'], { name: 'outbox_messages_due', transaction });
    await qi.addIndex('outbox_messages', ['trial_id', 'created_at'], { name: 'outbox_messages_trial', transaction });
    await qi.addIndex('outbox_messages', ['enrollment_id'], { name: 'outbox_messages_enrollment', transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.dropTable('outbox_messages');
};
