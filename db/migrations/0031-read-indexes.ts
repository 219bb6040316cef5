import type { QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

// Indexes that match the filters and orders of the trial page's reads (each checked with EXPLAIN
// in tests/server/api/read-paths.test.ts): a trial's enrolments and applications in page order,
// a person's enrolments and applications (My trials, past reliability), and a pattern's trials
// (the findings revision trigger on the size chart).
const INDEXES: { table: string; name: string; fields: string[] }[] = [
  { table: 'enrollments', name: 'enrollments_trial_page', fields: ['trial_id', 'created_at', 'id'] },
  { table: 'enrollments', name: 'enrollments_user', fields: ['user_id'] },
  { table: 'applications', name: 'applications_trial_page', fields: ['trial_id', 'applied_at', 'id'] },
  { table: 'applications', name: 'applications_user', fields: ['user_id'] },
  { table: 'trials', name: 'trials_pattern', fields: ['pattern_id'] },
];

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const i of INDEXES) await qi.addIndex(i.table, i.fields, { name: i.name, transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const i of [...INDEXES].reverse()) await qi.removeIndex(i.table, i.name, { transaction });
  });
};
