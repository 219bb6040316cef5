import { Op, type Transaction } from 'sequelize';
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

/** The report as the tester's form shows it; `version` is what the next save must name. */
function stateOf(stage: Stage, report: Report | null, prefill: { content: ReportDraft; parts: ReportPart[] }, due: Date | null, choices: Awaited<ReturnType<typeof choicesFor>>) {
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

/**
 * Submits the report, complete and on time, in one transaction with everything a submission
 * changes (the submission time, the enrolment finished by a final report): it all happens or
 * none of it does. Submitting again changes nothing, so a retry after an error is safe. With a
 * `version`, a report saved elsewhere since the tester last saw it is not submitted unseen.
 * The answer is the report exactly as stored.
 */
export async function submitReport(enrollmentId: string, stage: Stage, user: User, input: z.output<typeof reportSubmitSchema> = {}) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  const due = await dueAt(enrollment, stage);
  const choices = await choicesFor(enrollment);
  const report = await Report.sequelize!.transaction(async (transaction) => {
    // The enrolment first, then the report: the same order as saves and withdrawals, so no deadlock.
    const locked = (await Enrollment.findByPk(enrollment.id, { lock: transaction.LOCK.UPDATE, transaction }))!;
    assertOpen(locked);
    assertEditable(due, stage, user);
    const row = await Report.findOne({ where: { enrollmentId, stage }, lock: transaction.LOCK.UPDATE, transaction });
    if (input.version !== undefined && (row?.version ?? 0) !== input.version) {
      throw new StaleReportError(stateOf(stage, row, await prefillFor(enrollmentId, stage, transaction), due, choices));
    }
    const complete = reportCompleteSchema.safeParse(row?.content ?? {});
    if (!complete.success || !row) {
      const fields: Record<string, string> = {};
      for (const issue of complete.error?.issues ?? []) fields[issue.path.join('.') || 'report'] ??= issue.message;
      throw badRequest('The report is not complete yet.', fields);
    }
    if (!row.submittedAt) await row.update({ submittedAt: new Date() }, { transaction });
    if (stage === 'final' && locked.status === 'active') await locked.update({ status: 'finished' }, { transaction });
    return row;
  });
  // Stored: from here nothing may turn the tester's answer into an error. Reminders are checked
  // again before every delivery, so one not cancelled here still never goes out.
  try {
    await cancelObsoleteReminders({ enrollmentId: enrollment.id });
  } catch (error) {
    console.error('[reports] reminders not cancelled after a submission:', error instanceof Error ? error.message : error);
  }
  await scheduleFindingsRefresh(enrollment.trialId);
  return stateOf(stage, report, { content: {}, parts: [] }, due, choices);
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
