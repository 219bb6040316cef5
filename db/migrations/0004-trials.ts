import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const ref = (model: string, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT', allowNull = false) => ({
  type: DataTypes.UUID,
  allowNull,
  references: { model, key: 'id' },
  onDelete,
});

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      'trials',
      {
        id,
        studio_id: ref('studios', 'CASCADE'),
        pattern_id: ref('patterns', 'RESTRICT'),
        slug: { type: DataTypes.STRING(90), allowNull: false, unique: true },
        title: { type: DataTypes.STRING(160), allowNull: false },
        call_text: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        requirements: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
        // Sizes wanted with testers per size, height bands, variants (see server/domain/coverage.ts).
        coverage: { type: DataTypes.JSONB, allowNull: false, defaultValue: { sizes: [], heightBands: [], variants: [] } },
        ...timestamps,
      },
      { transaction },
    );
    await qi.sequelize.query("ALTER TABLE trials ADD CONSTRAINT trials_state CHECK (state IN ('draft','open','running','closed'))", { transaction });
    await qi.addIndex('trials', ['studio_id'], { transaction });

    await qi.createTable(
      'milestones',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        kind: { type: DataTypes.STRING(24), allowNull: false },
        due_at: { type: DataTypes.DATE, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('milestones', { type: 'unique', fields: ['trial_id', 'kind'], name: 'milestones_trial_kind', transaction });

    await qi.createTable(
      'applications',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        user_id: ref('users', 'CASCADE'),
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'applied' },
        size_id: ref('pattern_sizes', 'SET NULL', true),
        variant_id: ref('pattern_variants', 'SET NULL', true),
        // The tester's profile and size advice as they were when applying.
        profile_snapshot: { type: DataTypes.JSONB, allowNull: false },
        advice_snapshot: { type: DataTypes.JSONB, allowNull: true },
        planned_fabric: { type: DataTypes.STRING(500), allowNull: false },
        experience: { type: DataTypes.STRING(20), allowNull: false },
        photo_consent: { type: DataTypes.STRING(12), allowNull: false },
        note: { type: DataTypes.STRING(2000), allowNull: true },
        decision_reason: { type: DataTypes.STRING(500), allowNull: true },
        applied_at: { type: DataTypes.DATE, allowNull: false },
        decided_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('applications', { type: 'unique', fields: ['trial_id', 'user_id'], name: 'applications_one_per_tester', transaction });
    await qi.sequelize.query(
      "ALTER TABLE applications ADD CONSTRAINT applications_status CHECK (status IN ('applied','shortlisted','selected','waitlisted','declined','withdrawn')), " +
        "ADD CONSTRAINT applications_consent CHECK (photo_consent IN ('staff-only','may-share'))",
      { transaction },
    );

    await qi.createTable(
      'enrollments',
      {
        id,
        trial_id: ref('trials', 'CASCADE'),
        application_id: { ...ref('applications', 'CASCADE'), unique: true },
        user_id: ref('users', 'CASCADE'),
        size_id: ref('pattern_sizes', 'RESTRICT'),
        variant_id: ref('pattern_variants', 'SET NULL', true),
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'active' },
        // Per-milestone due dates granted to this tester: { [kind]: ISO time }.
        due_overrides: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        ...timestamps,
      },
      { transaction },
    );
    await qi.sequelize.query("ALTER TABLE enrollments ADD CONSTRAINT enrollments_status CHECK (status IN ('active','dropped','finished'))", { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('enrollments', { transaction });
    await qi.dropTable('applications', { transaction });
    await qi.dropTable('milestones', { transaction });
    await qi.dropTable('trials', { transaction });
  });
};
