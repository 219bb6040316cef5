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
