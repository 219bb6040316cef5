import { QueryTypes } from 'sequelize';
import { Milestone, PatternSize, Trial } from '../../db/models';
import type { ReportDraft } from '../domain/schemas/reports';
import type { Cursor } from '../pagination';

type Filter = { stage?: 'check-in' | 'final'; sizeId?: string; draft?: number; variant?: string };
type Row = {
  id: string;
  enrollment_id: string;
  stage: 'check-in' | 'final';
  content: ReportDraft;
  submitted_at: Date | null;
  enrollment_created_at: Date;
  size_id: string;
  due_overrides: Record<string, string>;
  tester: string | null;
};

/**
 * One page of a trial's reports for its staff, in the order of the enrolments (then check-in
 * before final), filtered in SQL by stage, size, draft and variant ("-" for the main pattern).
 * Keyset paging on (enrolment created, enrolment id, stage), which the enrolments' page index serves.
 */
export async function trialReportsPage(trial: Trial, filter: Filter, limit: number, after: Cursor | null) {
  const bind: unknown[] = [trial.id];
  // Staff see a report once the tester has sent it; a draft in progress stays the tester's own.
  const where: string[] = ['e.trial_id = $1', 'r.submitted_at IS NOT NULL'];
  const add = (sql: (n: number) => string, value: unknown) => {
    bind.push(value);
    where.push(sql(bind.length));
  };
  if (filter.sizeId) add((n) => `e.size_id = $${n}`, filter.sizeId);
  if (filter.stage) add((n) => `r.stage = $${n}`, filter.stage);
  if (filter.draft) add((n) => `r.content -> 'draftVersion' = to_jsonb($${n}::int)`, filter.draft);
  if (filter.variant === '-') where.push(`COALESCE(r.content ->> 'variantSewn', '') = ''`);
  else if (filter.variant) add((n) => `r.content ->> 'variantSewn' = $${n}`, filter.variant);
  if (after) {
    bind.push(after.at, after.id, after.stage ?? '');
    where.push(`(e.created_at, e.id, r.stage) > ($${bind.length - 2}::timestamptz, $${bind.length - 1}::uuid, $${bind.length})`);
  }
  bind.push(limit + 1);
  const rows = await Trial.sequelize!.query<Row>(
    `SELECT r.id, r.enrollment_id, r.stage, r.content, r.submitted_at, e.created_at AS enrollment_created_at, e.size_id, e.due_overrides, u.name AS tester
       FROM enrollments e
       JOIN reports r ON r.enrollment_id = e.id
       LEFT JOIN users u ON u.id = e.user_id
      WHERE ${where.join(' AND ')}
      ORDER BY e.created_at, e.id, r.stage
      LIMIT $${bind.length}`,
    { bind, type: QueryTypes.SELECT },
  );
  const more = rows.length > limit;
  const page = rows.slice(0, limit);
  const [sizes, milestones] = await Promise.all([
    PatternSize.findAll({ where: { patternId: trial.patternId }, attributes: ['id', 'label'] }),
    Milestone.findAll({ where: { trialId: trial.id }, attributes: ['kind', 'dueAt'] }),
  ]);
  const labels = new Map(sizes.map((s) => [s.id, s.label]));
  const milestoneOf = { 'check-in': 'toile-check-in', final: 'final-report' } as const;
  const items = page.map((r) => {
    const kind = milestoneOf[r.stage];
    const due = r.due_overrides?.[kind] ? new Date(r.due_overrides[kind]) : (milestones.find((m) => m.kind === kind)?.dueAt ?? null);
    const submittedAt = r.submitted_at ? new Date(r.submitted_at) : null;
    return {
      id: r.id,
      enrollmentId: r.enrollment_id,
      tester: r.tester ?? '',
      size: labels.get(r.size_id) ?? '?',
      stage: r.stage,
      content: r.content,
      submittedAt,
      onTime: submittedAt ? !due || submittedAt <= due : null,
    };
  });
  const last = page[page.length - 1];
  return { items, next: more && last ? { at: new Date(last.enrollment_created_at).toISOString(), id: last.enrollment_id, stage: last.stage } : null };
}
