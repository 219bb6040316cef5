import type { z } from 'zod';
import { Draft, Enrollment, Milestone, Pattern, PatternSize, PatternVariant, Report, Trial, User } from '../../db/models';
import { alterationKindsFor } from '../domain/alterations';
import type { GarmentCategory } from '../domain/garments';
import { reportCompleteSchema, type ReportDraft, type reportDraftSchema } from '../domain/schemas/reports';
import { badRequest, conflict, notFound, notYours } from '../errors';
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

export async function getReport(enrollmentId: string, stage: Stage, user: User) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  const report = await Report.findOne({ where: { enrollmentId, stage } });
  const due = await dueAt(enrollment, stage);
  return { stage, content: report?.content ?? {}, submittedAt: report?.submittedAt ?? null, dueAt: due, editable: !due || due > new Date(), choices: await choicesFor(enrollment) };
}

/** What the form offers to pick from: the chart's sizes, the pattern's variants and its drafts. */
async function choicesFor(enrollment: Enrollment & { trial: Trial & { pattern: Pattern } }) {
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

/**
 * Saves what the tester has entered so far; each part sent replaces that part, the rest stays.
 * Kinds of alteration must be ones the garment has. Editable until the due time.
 */
export async function saveReport(enrollmentId: string, stage: Stage, user: User, input: z.output<typeof reportDraftSchema>) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  if (enrollment.status !== 'active' && enrollment.status !== 'finished') throw conflict('You have left this trial, so its reports are closed.');
  assertEditable(await dueAt(enrollment, stage), stage, user);
  if (input.alterations) {
    const allowed = new Set(alterationKindsFor(enrollment.trial.pattern.category as GarmentCategory).map((k) => k.key));
    const fields: Record<string, string> = {};
    input.alterations.forEach((a, i) => {
      if (!allowed.has(a.kind)) fields[`alterations.${i}.kind`] = 'is not an alteration of this garment';
    });
    if (Object.keys(fields).length) throw badRequest('Some alterations do not fit this garment; nothing was changed.', fields);
  }
  const [report] = await Report.findOrCreate({ where: { enrollmentId, stage }, defaults: { enrollmentId, stage } });
  await report.update({ content: { ...report.content, ...input } as ReportDraft });
  // A submitted report changed after the fact: the findings follow it.
  if (report.submittedAt) await scheduleFindingsRefresh(enrollment.trialId);
  return report;
}

/** Submits the report: complete, on time; submitting again changes nothing but the content saved. */
export async function submitReport(enrollmentId: string, stage: Stage, user: User) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  assertEditable(await dueAt(enrollment, stage), stage, user);
  const report = await Report.findOne({ where: { enrollmentId, stage } });
  const complete = reportCompleteSchema.safeParse(report?.content ?? {});
  if (!complete.success) {
    const fields: Record<string, string> = {};
    for (const issue of complete.error.issues) fields[issue.path.join('.') || 'report'] ??= issue.message;
    throw badRequest('The report is not complete yet.', fields);
  }
  if (!report!.submittedAt) await report!.update({ submittedAt: new Date() });
  if (stage === 'final' && enrollment.status === 'active') await enrollment.update({ status: 'finished' });
  await cancelObsoleteReminders({ enrollmentId: enrollment.id });
  await scheduleFindingsRefresh(enrollment.trialId);
  return report!;
}

/** The reports of a trial for its staff, filtered by stage, size and draft version. */
export async function trialReports(trial: Trial, filter: { stage?: Stage; sizeId?: string; draft?: number; variant?: string }) {
  const enrollments = await Enrollment.findAll({
    where: { trialId: trial.id, ...(filter.sizeId ? { sizeId: filter.sizeId } : {}) },
    include: [{ model: User, as: 'user' }, { model: Report, as: 'reports' }],
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
