import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    const trial = { type: DataTypes.UUID, allowNull: false, references: { model: 'trials', key: 'id' }, onDelete: 'CASCADE' };
    const person = { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };
    const stamps = { created_at: { type: DataTypes.DATE, allowNull: false }, updated_at: { type: DataTypes.DATE, allowNull: false } };

    // The findings of one draft as last computed, and a hash of what they were computed from.
    await qi.createTable(
      'finding_snapshots',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        trial_id: trial,
        draft: { type: DataTypes.STRING(20), allowNull: false },
        source_hash: { type: DataTypes.STRING(64), allowNull: false },
        testers: { type: DataTypes.INTEGER, allowNull: false },
        result: { type: DataTypes.JSONB, allowNull: false },
        computed_at: { type: DataTypes.DATE, allowNull: false },
        ...stamps,
      },
      { transaction },
    );
    await qi.addConstraint('finding_snapshots', { type: 'unique', fields: ['trial_id', 'draft'], name: 'finding_snapshots_one_per_draft', transaction });

    // What the studio decided about a finding (kind + direction), kept across recomputations.
    await qi.createTable(
      'finding_triage',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        trial_id: trial,
        kind: { type: DataTypes.STRING(320), allowNull: false },
        direction: { type: DataTypes.STRING(8), allowNull: false },
        state: { type: DataTypes.STRING(16), allowNull: false },
        fixed_in_draft: { type: DataTypes.INTEGER, allowNull: true },
        updated_by_id: person,
        ...stamps,
      },
      { transaction },
    );
    await qi.addConstraint('finding_triage', { type: 'unique', fields: ['trial_id', 'kind', 'direction'], name: 'finding_triage_one_per_finding', transaction });
    await qi.sequelize.query(
      "ALTER TABLE finding_triage ADD CONSTRAINT finding_triage_state CHECK (state IN ('open','will-fix','personal-fit','fixed')), " +
        "ADD CONSTRAINT finding_triage_direction CHECK (direction IN ('add','remove')), " +
        "ADD CONSTRAINT finding_triage_fixed_draft CHECK ((state = 'fixed') = (fixed_in_draft IS NOT NULL))",
      { transaction },
    );

    await qi.createTable(
      'finding_notes',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        trial_id: trial,
        kind: { type: DataTypes.STRING(320), allowNull: false },
        direction: { type: DataTypes.STRING(8), allowNull: false },
        author_id: person,
        body: { type: DataTypes.TEXT, allowNull: false },
        ...stamps,
      },
      { transaction },
    );
    await qi.addIndex('finding_notes', ['trial_id', 'kind', 'direction'], { transaction });

    // A coordinator's reading of an "other" alteration: every report of the trial that describes
    // it in the same words (case and spacing aside) counts as that kind.
    await qi.createTable(
      'other_alteration_mappings',
      {
        id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
        trial_id: trial,
        text_key: { type: DataTypes.STRING(300), allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        mapped_by_id: person,
        ...stamps,
      },
      { transaction },
    );
    await qi.addConstraint('other_alteration_mappings', { type: 'unique', fields: ['trial_id', 'text_key'], name: 'other_alteration_mappings_one_per_text', transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  for (const table of ['other_alteration_mappings', 'finding_notes', 'finding_triage', 'finding_snapshots']) await qi.dropTable(table);
};
