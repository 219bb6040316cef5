import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const patternRef = {
  type: DataTypes.UUID,
  allowNull: false,
  references: { model: 'patterns', key: 'id' },
  onDelete: 'CASCADE',
};

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // Studio-wide thresholds (size advice now, analysis later); defaults live in code.
    await qi.addColumn('studios', 'settings', { type: DataTypes.JSONB, allowNull: false, defaultValue: {} }, { transaction });

    await qi.createTable(
      'patterns',
      {
        id,
        studio_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
        name: { type: DataTypes.STRING(120), allowNull: false },
        category: { type: DataTypes.STRING(30), allowNull: false },
        fabric_kind: { type: DataTypes.STRING(20), allowNull: false },
        min_stretch_pct: { type: DataTypes.SMALLINT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        // Lengths in millimetres, like every length Basted stores.
        drafted_height_mm: { type: DataTypes.REAL, allowNull: true },
        body_columns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        finished_columns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        archived_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex('patterns', ['studio_id'], { transaction });
    await qi.sequelize.query(
      "ALTER TABLE patterns ADD CONSTRAINT patterns_stretch CHECK (min_stretch_pct IS NULL OR min_stretch_pct BETWEEN 0 AND 200), " +
        "ADD CONSTRAINT patterns_knit_stretch CHECK (fabric_kind <> 'knit' OR min_stretch_pct IS NOT NULL)",
      { transaction },
    );

    await qi.createTable(
      'pattern_sizes',
      {
        id,
        pattern_id: patternRef,
        label: { type: DataTypes.STRING(20), allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        body_mm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        finished_mm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('pattern_sizes', { type: 'unique', fields: ['pattern_id', 'label'], name: 'pattern_sizes_label', transaction });

    await qi.createTable(
      'pattern_variants',
      {
        id,
        pattern_id: patternRef,
        name: { type: DataTypes.STRING(80), allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        // The body columns this variant overrides, and its values: { [sizeId]: { [key]: mm } }.
        columns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        values_mm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('pattern_variants', { type: 'unique', fields: ['pattern_id', 'name'], name: 'pattern_variants_name', transaction });

    await qi.createTable(
      'fabric_needs',
      {
        id,
        pattern_id: patternRef,
        size_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pattern_sizes', key: 'id' }, onDelete: 'CASCADE' },
        width_mm: { type: DataTypes.REAL, allowNull: false },
        napped: { type: DataTypes.BOOLEAN, allowNull: false },
        length_mm: { type: DataTypes.REAL, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addConstraint('fabric_needs', {
      type: 'unique',
      fields: ['size_id', 'width_mm', 'napped'],
      name: 'fabric_needs_size_width_layout',
      transaction,
    });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable('fabric_needs', { transaction });
    await qi.dropTable('pattern_variants', { transaction });
    await qi.dropTable('pattern_sizes', { transaction });
    await qi.dropTable('patterns', { transaction });
    await qi.removeColumn('studios', 'settings', { transaction });
  });
};
