import { Op } from 'sequelize';
import { Enrollment, Milestone, Report, Trial } from '../../db/models';
import type { MilestoneKind } from '../domain/trials';

/** The report stage that answers each tester milestone. */
export const STAGE_OF: Partial<Record<MilestoneKind, 'check-in' | 'final'>> = { 'toile-check-in': 'check-in', 'final-report': 'final' };

/** Trials whose testers are reminded: a closed or unpublished trial asks nothing of anyone. */
export const REMINDING_TRIAL_STATES = ['open', 'running'] as const;

/** A tester's own due time for a milestone: the date granted to them, else the trial's. */
export function dueFor(enrollment: Enrollment, milestones: Milestone[], kind: MilestoneKind): Date | null {
  const override = enrollment.dueOverrides?.[kind];
  if (override) return new Date(override);
  return milestones.find((m) => m.kind === kind)?.dueAt ?? null;
}

/**
 * Why a reminder recorded for (enrollment, milestone, due time) should no longer go out, or null
 * when it still should. Checked again right before every delivery, so a submission, a withdrawal
 * or a new date stops a reminder even if it was queued for a retry.
 */
export async function reminderObsolete(row: { enrollmentId: string | null; milestoneKind: string | null; dueAt: Date | null }): Promise<string | null> {
  if (!row.enrollmentId || !row.milestoneKind) return 'the enrollment no longer exists';
  const enrollment = await Enrollment.findByPk(row.enrollmentId, { include: [{ model: Trial, as: 'trial', include: [{ model: Milestone, as: 'milestones' }] }] });
  if (!enrollment || !enrollment.trial) return 'the enrollment no longer exists';
  const kind = row.milestoneKind as MilestoneKind;
  const stage = STAGE_OF[kind];
  // Checked first: a final report also finishes the enrollment, and the reason shown should say so.
  if (stage && (await Report.count({ where: { enrollmentId: enrollment.id, stage, submittedAt: { [Op.ne]: null } } })) > 0) {
    return 'the tester has submitted it';
  }
  if (enrollment.status !== 'active') return 'the tester is no longer active in the trial';
  if (enrollment.excusedAt) return 'the studio excused the tester';
  if (!(REMINDING_TRIAL_STATES as readonly string[]).includes(enrollment.trial.state)) return 'the trial is closed';
  const due = dueFor(enrollment, enrollment.trial.milestones ?? [], kind);
  if (!due || !row.dueAt || due.getTime() !== row.dueAt.getTime()) return 'the due date has changed';
  return null;
}

/**
 * reminderObsolete for a batch of reminder rows at once (the outbox's flush): their enrolments with
 * trial and milestones in one query, the submitted stages in another; the same reasons, by row id.
 */
export async function remindersObsolete(rows: { id: string; enrollmentId: string | null; milestoneKind: string | null; dueAt: Date | null }[]): Promise<Map<string, string | null>> {
  const out = new Map<string, string | null>();
  const ids = [...new Set(rows.map((r) => r.enrollmentId).filter((id): id is string => Boolean(id)))];
  if (ids.length === 0) {
    for (const row of rows) out.set(row.id, 'the enrollment no longer exists');
    return out;
  }
  const enrollments = await Enrollment.findAll({
    where: { id: ids },
    attributes: ['id', 'status', 'dueOverrides', 'trialId'],
    include: [{ model: Trial, as: 'trial', attributes: ['id', 'state'], include: [{ model: Milestone, as: 'milestones', attributes: ['id', 'kind', 'dueAt'] }] }],
  });
  const byId = new Map(enrollments.map((e) => [e.id, e]));
  const submitted = new Set(
    (await Report.findAll({ where: { enrollmentId: ids, submittedAt: { [Op.ne]: null } }, attributes: ['enrollmentId', 'stage'] })).map((r) => `${r.enrollmentId}|${r.stage}`),
  );
  for (const row of rows) {
    const enrollment = row.enrollmentId ? byId.get(row.enrollmentId) : undefined;
    if (!row.enrollmentId || !row.milestoneKind || !enrollment || !enrollment.trial) {
      out.set(row.id, 'the enrollment no longer exists');
      continue;
    }
    const kind = row.milestoneKind as MilestoneKind;
    const stage = STAGE_OF[kind];
    // The same order of reasons as reminderObsolete.
    if (stage && submitted.has(`${enrollment.id}|${stage}`)) out.set(row.id, 'the tester has submitted it');
    else if (enrollment.status !== 'active') out.set(row.id, 'the tester is no longer active in the trial');
    else if (!(REMINDING_TRIAL_STATES as readonly string[]).includes(enrollment.trial.state)) out.set(row.id, 'the trial is closed');
    else {
      const due = dueFor(enrollment, enrollment.trial.milestones ?? [], kind);
      out.set(row.id, !due || !row.dueAt || due.getTime() !== row.dueAt.getTime() ? 'the due date has changed' : null);
    }
  }
  return out;
}
