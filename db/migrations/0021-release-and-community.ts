import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const ref = (model: string, onDelete: 'CASCADE' | 'SET NULL', allowNull = false) => ({
  type: DataTypes.UUID,
  allowNull,
  references: { model, key: 'id' },
  onDelete,
});

/**
 * What happens after the last report: the release of a trial (its final draft, the coverage gap
 * the studio accepted, the open items it confirmed), testers excused from finishing, reward
 * codes, announcements and who received them, invitations from the tester pool, private
 * calendar feeds, and accounts deleted by their owner (kept as an anonymous row so the reports
 * already counted in a studio's findings stay).
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn('trials', 'released_at', { type: DataTypes.DATE, allowNull: true }, { transaction });
    await qi.addColumn('trials', 'released_by_id', ref('users', 'SET NULL', true), { transaction });
    await qi.addColumn('trials', 'final_draft_id', ref('drafts', 'SET NULL', true), { transaction });
    await qi.addColumn('trials', 'coverage_gap_note', { type: DataTypes.STRING(2000), allowNull: true }, { transaction });
    // The checklist items that were still open when the release was confirmed, as they read then.
    await qi.addColumn('trials', 'release_open_items', { type: DataTypes.JSONB, allowNull: true }, { transaction });
    await qi.addColumn('trials', 'copied_from_id', ref('trials', 'SET NULL', true), { transaction });
    // When the photos of a released trial were removed under the studio's keeping period.
    await qi.addColumn('trials', 'photos_removed_at', { type: DataTypes.DATE, allowNull: true }, { transaction });

    await qi.addColumn('enrollments', 'excused_at', { type: DataTypes.DATE, allowNull: true }, { transaction });
    await qi.addColumn('enrollments', 'excuse_note', { type: DataTypes.STRING(500), allowNull: true }, { transaction });

    await qi.addColumn('users', 'deleted_at', { type: DataTypes.DATE, allowNull: true }, { transaction });

    await qi.createTable(
      'reward_codes',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        code: { type: DataTypes.STRING(200), allowNull: false },
        // One code per finisher: the unique key is what keeps a second code from being given.
        enrollment_id: { ...ref('enrollments', 'SET NULL', true), unique: true },
        assigned_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('reward_codes', { type: 'unique', fields: ['trial_id', 'code'], name: 'reward_codes_trial_code', transaction });

    await qi.createTable(
      'announcements',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        author_id: ref('users', 'SET NULL', true),
        subject: { type: DataTypes.STRING(200), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        // Who it was for, as chosen: { statuses, sizeIds }.
        audience: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        reply_to: { type: DataTypes.STRING(254), allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex('announcements', ['trial_id', 'created_at'], { name: 'announcements_trial', transaction });
    await qi.createTable(
      'announcement_recipients',
      {
        announcement_id: { ...ref('announcements', 'CASCADE'), primaryKey: true },
        user_id: { ...ref('users', 'CASCADE'), primaryKey: true },
        created_at: { type: DataTypes.DATE, allowNull: false },
      },
      { transaction },
    );
    await qi.addIndex('announcement_recipients', ['user_id'], { name: 'announcement_recipients_user', transaction });

    await qi.createTable(
      'pool_invitations',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        user_id: ref('users', 'CASCADE'),
        invited_by_id: ref('users', 'SET NULL', true),
        // Null while the call is not open yet: sent when it opens.
        sent_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('pool_invitations', { type: 'unique', fields: ['trial_id', 'user_id'], name: 'pool_invitations_once', transaction });

    await qi.createTable(
      'calendar_feeds',
      {
        // The id is half of the feed's secret address; a new link is a new row.
        id,
        user_id: { ...ref('users', 'CASCADE'), unique: true },
        ...timestamps,
      },
      { transaction },
    );
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('calendar_feeds', { transaction });
    await qi.dropTable('pool_invitations', { transaction });
    await qi.dropTable('announcement_recipients', { transaction });
    await qi.dropTable('announcements', { transaction });
    await qi.dropTable('reward_codes', { transaction });
    await qi.removeColumn('users', 'deleted_at', { transaction });
    await qi.removeColumn('enrollments', 'excuse_note', { transaction });
    await qi.removeColumn('enrollments', 'excused_at', { transaction });
    for (const column of ['photos_removed_at', 'copied_from_id', 'release_open_items', 'coverage_gap_note', 'final_draft_id', 'released_by_id', 'released_at']) {
      await qi.removeColumn('trials', column, { transaction });
    }
  });
};
