import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { z } from 'zod';
import { Draft, Enrollment, Milestone, Pattern, PatternSize, PatternVariant, Report, Trial, User } from '../../db/models';
import { alterationKindsFor } from '../domain/alterations';
import type { GarmentCategory } from '../domain/garments';
import { reportCompleteSchema, type ReportDraft, type ReportPart, type reportSaveSchema, type reportSubmitSchema } from '../domain/schemas/reports';
import { AppError, badRequest, conflict, notFound, notYours } from '../errors';
import { scheduleFindingsRefresh } from '../findings/findings-jobs';
import { cancelObsoleteReminders } from '../outbox/outbox.service';
import { formatDue } from '../trials/trial-mail';

export type Stage = 'check-in' | 'final';
const MILESTONE_OF: Record<Stage, 'toile-check-in' | 'final-report'> = { 'check-in': 'toile-check-in', final: 'final-report' };

async function ownEnrollment(enrollmentId: string, user: User) {
  const enrollment = await Enrollment.findOne({
    where: { id: enrollmentId, userId: user.id },
    include: [{ model: Trial, as: 'trial', include: [{ model: Pattern, as: 'pattern' }] }],
  });
  if (!enrollment) throw (await Enrollment.count({ where: { id: enrollmentId } })) ? notYours('enrolment') : notFound('enrollment');
  return enrollment as Enrollment & { trial: Trial & { pattern: Pattern } };
}

/** The tester's own due time for a report: the date granted to them, else the trial's. */
async function dueAt(enrollment: Enrollment, stage: Stage): Promise<Date | null> {
  const kind = MILESTONE_OF[stage];
  if (enrollment.dueOverrides[kind]) return new Date(enrollment.dueOverrides[kind]);
  return (await Milestone.findOne({ where: { trialId: enrollment.trialId, kind } }))?.dueAt ?? null;
}

function assertEditable(due: Date | null, stage: Stage, user: User) {
  if (due && due <= new Date()) {
    throw conflict(`The ${stage === 'final' ? 'final report' : 'check-in'} was due on ${formatDue(due, user.timeZone)}. Ask the studio for more time to change it.`);
  }
}

/** The parts a final report takes over from the check-in: what was sewn and how it fitted. */
const CARRIED_FROM_CHECK_IN = ['sizeSewn', 'variantSewn', 'draftVersion', 'fit'] as const satisfies readonly ReportPart[];

/** What a new final report starts from: the check-in's answers on size, variant, draft and fit. */
async function prefillFor(enrollmentId: string, stage: Stage, transaction?: Transaction): Promise<{ content: ReportDraft; parts: ReportPart[] }> {
  if (stage !== 'final') return { content: {}, parts: [] };
  const checkIn = await Report.findOne({ where: { enrollmentId, stage: 'check-in' }, transaction });
  const content: ReportDraft = {};
  const parts: ReportPart[] = [];
  for (const part of CARRIED_FROM_CHECK_IN) {
    const value = checkIn?.content[part];
    if (value === undefined || (part === 'fit' && Object.keys(value ?? {}).length === 0)) continue;
    (content as Record<string, unknown>)[part] = structuredClone(value);
    parts.push(part);
  }
  return { content, parts };
}

type Owned = Awaited<ReturnType<typeof ownEnrollment>>;

type StoredReport = Pick<Report, 'content' | 'version' | 'submittedAt' | 'prefilled'>;

/** The report as the tester's form shows it; `version` is what the next save must name. */
function stateOf(stage: Stage, report: StoredReport | null, prefill: { content: ReportDraft; parts: ReportPart[] }, due: Date | null, choices: Awaited<ReturnType<typeof choicesFor>>) {
  const parts = report ? (report.prefilled as ReportPart[]) : prefill.parts;
  return {
    stage,
    content: report ? report.content : prefill.content,
    version: report?.version ?? 0,
    submittedAt: report?.submittedAt ?? null,
    prefilledFrom: parts.length ? ('check-in' as const) : null,
    prefilled: parts,
    dueAt: due,
    editable: !due || due > new Date(),
    choices,
  };
}
export type ReportState = ReturnType<typeof stateOf>;

export async function getReport(enrollmentId: string, stage: Stage, user: User) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  const report = await Report.findOne({ where: { enrollmentId, stage } });
  const prefill = report ? { content: {}, parts: [] } : await prefillFor(enrollmentId, stage);
  return stateOf(stage, report, prefill, await dueAt(enrollment, stage), await choicesFor(enrollment));
}

/** What the form offers to pick from: the chart's sizes, the pattern's variants and its drafts. */
async function choicesFor(enrollment: Owned) {
  const patternId = enrollment.trial.patternId;
  const [sizes, variants, drafts] = await Promise.all([
    PatternSize.findAll({ where: { patternId }, order: [['position', 'ASC']] }),
    PatternVariant.findAll({ where: { patternId }, order: [['name', 'ASC']] }),
    Draft.findAll({ where: { patternId }, order: [['version', 'ASC']] }),
  ]);
  return {
    sizes: sizes.map((s) => s.label),
    chosenSize: sizes.find((s) => s.id === enrollment.sizeId)?.label ?? null,
    variants: variants.map((v) => v.name),
    drafts: drafts.map((d) => ({ version: d.version, changeNote: d.changeNote, createdAt: d.createdAt })),
  };
}

/** A save or submission made on an older version of the report: nothing was changed. */
export class StaleReportError extends AppError {
  constructor(readonly current: ReportState) {
    super(409, 'stale_report', 'This report was changed in another window or on another device since this one last saved.');
  }
}

function assertOpen(enrollment: Enrollment) {
  if (enrollment.status !== 'active' && enrollment.status !== 'finished') throw conflict('You have left this trial, so its reports are closed.');
}

/**
 * Saves what the tester has entered so far: each part sent replaces that part, the rest stays.
 * The report row is locked for the merge and the save applies only to the version it was made
 * on, so two windows saving at once never overwrite each other unseen: the later one gets a
 * StaleReportError carrying the report as it now is. Kinds of alteration must be ones the
 * garment has. Editable until the due time.
 */
export async function saveReport(enrollmentId: string, stage: Stage, user: User, input: z.output<typeof reportSaveSchema>) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  assertOpen(enrollment);
  const due = await dueAt(enrollment, stage);
  assertEditable(due, stage, user);
  const { changes, baseVersion } = input;
  if (changes.alterations) {
    const allowed = new Set(alterationKindsFor(enrollment.trial.pattern.category as GarmentCategory).map((k) => k.key));
    const fields: Record<string, string> = {};
    changes.alterations.forEach((a, i) => {
      if (a.kind !== null && !allowed.has(a.kind)) fields[`alterations.${i}.kind`] = 'is not an alteration of this garment';
    });
    if (Object.keys(fields).length) throw badRequest('Some alterations do not fit this garment; nothing was changed.', fields);
  }
  const choices = await choicesFor(enrollment);
  const where = { enrollmentId, stage };
  const report = await Report.sequelize!.transaction(async (transaction) => {
    let row = await Report.findOne({ where, lock: transaction.LOCK.UPDATE, transaction });
    if (!row) {
      const prefill = await prefillFor(enrollmentId, stage, transaction);
      // ON CONFLICT DO NOTHING: a save racing this one may create the row first; both then lock it.
      await Report.bulkCreate([{ enrollmentId, stage, content: prefill.content, prefilled: prefill.parts }], { ignoreDuplicates: true, transaction });
      row = (await Report.findOne({ where, lock: transaction.LOCK.UPDATE, transaction }))!;
    }
    if (row.version !== baseVersion) throw new StaleReportError(stateOf(stage, row, { content: {}, parts: [] }, due, choices));
    return row.update({ content: { ...row.content, ...changes }, version: row.version + 1 }, { transaction });
  });
  // A submitted report changed after the fact: the findings follow it.
  if (report.submittedAt) await scheduleFindingsRefresh(enrollment.trialId);
  return stateOf(stage, report, { content: {}, parts: [] }, due, choices);
}

/** Everything a submission checks and answers with, read in one query (a submission is a hot path). */
type SubmissionContext = {
  userId: string;
  status: Enrollment['status'];
  trialId: string;
  sizeId: string;
  dueOverrides: Record<string, string>;
  milestoneDue: Date | null;
  content: ReportDraft | null;
  version: number | null;
  submittedAt: Date | null;
  prefilled: ReportPart[] | null;
  sizes: [string, string][] | null;
  variants: string[] | null;
  drafts: [number, string, number][] | null;
};

async function submissionContext(enrollmentId: string, stage: Stage): Promise<SubmissionContext | null> {
  const [row] = await Report.sequelize!.query<SubmissionContext>(
    `SELECT e.user_id AS "userId", e.status, e.trial_id AS "trialId", e.size_id AS "sizeId", e.due_overrides AS "dueOverrides",
            (SELECT m.due_at FROM milestones m WHERE m.trial_id = e.trial_id AND m.kind = $3 LIMIT 1) AS "milestoneDue",
            r.content, r.version, r.submitted_at AS "submittedAt", r.prefilled,
            (SELECT json_agg(json_build_array(s.id, s.label) ORDER BY s.position) FROM pattern_sizes s WHERE s.pattern_id = t.pattern_id) AS sizes,
            (SELECT json_agg(v.name ORDER BY v.name) FROM pattern_variants v WHERE v.pattern_id = t.pattern_id) AS variants,
            (SELECT json_agg(json_build_array(d.version, d.change_note, floor(extract(epoch FROM d.created_at) * 1000)) ORDER BY d.version)
               FROM drafts d WHERE d.pattern_id = t.pattern_id) AS drafts
       FROM enrollments e
       JOIN trials t ON t.id = e.trial_id
       LEFT JOIN reports r ON r.enrollment_id = e.id AND r.stage = $2
      WHERE e.id = $1`,
    { bind: [enrollmentId, stage, MILESTONE_OF[stage]], type: QueryTypes.SELECT },
  );
  return row ?? null;
}

/**
 * Submits the report, complete and on time, with everything a submission changes (the submission
 * time, the enrolment finished by a final report) in one statement: it all happens or none of it
 * does. Submitting again changes nothing, so a retry after an error is safe. With a `version`, a
 * report saved elsewhere since the tester last saw it is not submitted unseen.
 *
 * The checks run on the report as read, and the write applies only to that same version of it,
 * with the enrolment locked first and still open: a save in between makes the write miss, and the
 * submission starts over on the report as it now is. One read and one autocommitted write keep
 * the trial's row (bumped by the findings trigger) locked for a single statement, so a due
 * evening's submissions do not queue behind each other. The answer is the report exactly as stored.
 */
export async function submitReport(enrollmentId: string, stage: Stage, user: User, input: z.output<typeof reportSubmitSchema> = {}) {
  for (let attempt = 0; ; attempt += 1) {
    const ctx = await submissionContext(enrollmentId, stage);
    if (!ctx) throw notFound('enrollment');
    if (ctx.userId !== user.id) throw notYours('enrolment');
    if (ctx.status !== 'active' && ctx.status !== 'finished') throw conflict('You have left this trial, so its reports are closed.');
    const kind = MILESTONE_OF[stage];
    const due = ctx.dueOverrides?.[kind] ? new Date(ctx.dueOverrides[kind]) : ctx.milestoneDue ? new Date(ctx.milestoneDue) : null;
    assertEditable(due, stage, user);
    const sizes = ctx.sizes ?? [];
    const choices = {
      sizes: sizes.map(([, label]) => label),
      chosenSize: sizes.find(([id]) => id === ctx.sizeId)?.[1] ?? null,
      variants: ctx.variants ?? [],
      drafts: (ctx.drafts ?? []).map(([version, changeNote, at]) => ({ version, changeNote, createdAt: new Date(at) })),
    };
    const row: StoredReport | null =
      ctx.version === null ? null : { content: ctx.content ?? {}, version: ctx.version, submittedAt: ctx.submittedAt ? new Date(ctx.submittedAt) : null, prefilled: ctx.prefilled ?? [] };
    if (input.version !== undefined && (row?.version ?? 0) !== input.version) {
      throw new StaleReportError(stateOf(stage, row, row ? { content: {}, parts: [] } : await prefillFor(enrollmentId, stage), due, choices));
    }
    const complete = reportCompleteSchema.safeParse(row?.content ?? {});
    if (!complete.success || !row) {
      const fields: Record<string, string> = {};
      for (const issue of complete.error?.issues ?? []) fields[issue.path.join('.') || 'report'] ??= issue.message;
      throw badRequest('The report is not complete yet.', fields);
    }
    let stored: StoredReport | null = row;
    if (!row.submittedAt || (stage === 'final' && ctx.status === 'active')) {
      const now = new Date();
      // The enrolment is locked first (the InitPlan runs before the report is touched), then the
      // report of the version checked above: the same order as saves and withdrawals.
      const [result] = await Report.sequelize!.query<{ submittedAt: Date | null; written: boolean }>(
        `WITH e AS (SELECT id FROM enrollments WHERE id = $1 AND status IN ('active', 'finished') FOR UPDATE),
              r AS (UPDATE reports
                       SET submitted_at = COALESCE(submitted_at, $4),
                           updated_at = CASE WHEN submitted_at IS NULL THEN $4 ELSE updated_at END
                     WHERE enrollment_id = (SELECT id FROM e) AND stage = $2 AND version = $3
                 RETURNING submitted_at),
              f AS (UPDATE enrollments SET status = 'finished', updated_at = $4
                     WHERE id = (SELECT id FROM e) AND status = 'active' AND $2 = 'final' AND EXISTS (SELECT 1 FROM r)
                 RETURNING id)
         SELECT (SELECT submitted_at FROM r) AS "submittedAt", EXISTS (SELECT 1 FROM r) AS written, (SELECT count(*) FROM f) AS finished`,
        { bind: [enrollmentId, stage, row.version, now], type: QueryTypes.SELECT },
      );
      // Saved in between, or the enrolment closed: start over on the report as it now is.
      stored = result.written ? { ...row, submittedAt: new Date(result.submittedAt!) } : null;
      if (!stored) {
        if (attempt < 5) continue;
        throw conflict('The report kept changing while it was being submitted; try again.');
      }
    }
    // Stored: from here nothing may turn the tester's answer into an error. Reminders are checked
    // again before every delivery, so one not cancelled here still never goes out.
    try {
      await cancelObsoleteReminders({ enrollmentId });
    } catch (error) {
      console.error('[reports] reminders not cancelled after a submission:', error instanceof Error ? error.message : error);
    }
    await scheduleFindingsRefresh(ctx.trialId);
    return stateOf(stage, stored, { content: {}, parts: [] }, due, choices);
  }
}

/** The reports of a trial for its staff, filtered by stage, size and draft version. */
export async function trialReports(trial: Trial, filter: { stage?: Stage; sizeId?: string; draft?: number; variant?: string }) {
  const enrollments = await Enrollment.findAll({
    where: { trialId: trial.id, ...(filter.sizeId ? { sizeId: filter.sizeId } : {}) },
    // Only what the tester submitted: a report they are still writing is theirs alone.
    include: [{ model: User, as: 'user' }, { model: Report, as: 'reports', where: { submittedAt: { [Op.ne]: null } }, required: false }],
    order: [['createdAt', 'ASC']],
  });
  const sizes = new Map((await PatternSize.findAll({ where: { patternId: trial.patternId } })).map((s) => [s.id, s.label]));
  const milestones = await Milestone.findAll({ where: { trialId: trial.id } });
  return enrollments.flatMap((e) => {
    const reports = ((e as Enrollment & { reports?: Report[] }).reports ?? []).filter(
      (r) =>
        (!filter.stage || r.stage === filter.stage) &&
        (!filter.draft || r.content.draftVersion === filter.draft) &&
        (!filter.variant || (filter.variant === '-' ? !r.content.variantSewn : r.content.variantSewn === filter.variant)),
    );
    return reports.map((r) => {
      const kind = MILESTONE_OF[r.stage];
      const due = e.dueOverrides[kind] ? new Date(e.dueOverrides[kind]) : milestones.find((m) => m.kind === kind)?.dueAt ?? null;
      return {
        id: r.id,
        enrollmentId: e.id,
        tester: (e as Enrollment & { user?: User }).user?.name ?? '',
        size: sizes.get(e.sizeId) ?? '?',
        stage: r.stage,
        content: r.content,
        submittedAt: r.submittedAt,
        onTime: r.submittedAt ? !due || r.submittedAt <= due : null,
      };
    });
  });
}
