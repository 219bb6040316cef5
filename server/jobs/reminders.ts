import { literal, Op } from 'sequelize';
import { Enrollment, Membership, Milestone, Report, Studio, Trial, User } from '../../db/models';
import type { Config } from '../config';
import { TESTER_EXPECTATIONS, TESTER_MILESTONES, type MilestoneKind } from '../domain/trials';
import { digestMail, reminderMail, type DigestLine } from '../mail/templates';
import { enqueue, optOutFor } from '../outbox/outbox.service';
import { formatDue } from '../trials/trial-mail';
import { REMINDING_TRIAL_STATES, STAGE_OF, dueFor } from './reminder-state';
import { daysLate, daysUntil, digestDayAt, reminderDueAt, safeZone } from './schedule';

/** What each tester milestone asks for, in the words of a reminder. */
export const WHAT_IS_DUE: Partial<Record<MilestoneKind, string>> = { 'toile-check-in': 'toile check-in', 'final-report': 'final report' };

export type Loaded = Enrollment & { user: User; trial: Trial & { milestones: Milestone[]; studio: Studio }; reports: Report[] };

/**
 * The active enrolments of trials that remind, with only what the sweep reads: the tester's name,
 * address and zone, the stage and time of each submitted report (not its content), the trial's
 * milestones and studio. A reminder tick and a digest tick within one pass share one load (see
 * runMailTick).
 */
export async function activeEnrollments(now: Date = new Date()): Promise<Loaded[]> {
  // Filtered in SQL: only enrolments that could owe something near now — a tester milestone due
  // within the next REMINDER_LOOKAHEAD_DAYS (the earliest reminder goes out 3 days before, in the
  // tester's own morning) or already past (the overdue reminder and the digest), or a date of
  // their own. A trial whose dates are weeks away costs nothing.
  const horizon = new Date(now.getTime() + REMINDER_LOOKAHEAD_DAYS * 86_400_000);
  const rows = await Enrollment.findAll({
    where: {
      status: 'active',
      // A tester the studio excused from finishing owes nothing more.
      excusedAt: null,
      [Op.or]: [
        literal(`"Enrollment"."due_overrides" <> '{}'::jsonb`),
        literal(
          `EXISTS (SELECT 1 FROM milestones m WHERE m.trial_id = "Enrollment"."trial_id" AND m.kind IN (${TESTER_MILESTONES.map((k) => Enrollment.sequelize!.escape(k)).join(', ')}) AND m.due_at <= ${Enrollment.sequelize!.escape(horizon.toISOString())}::timestamptz)`,
        ),
      ],
    },
    attributes: ['id', 'trialId', 'userId', 'status', 'dueOverrides'],
    include: [
      { model: User, as: 'user', required: true, attributes: ['id', 'name', 'email', 'timeZone', 'mailReminders'] },
      { model: Report, as: 'reports', attributes: ['id', 'stage', 'submittedAt'], where: { submittedAt: { [Op.ne]: null } }, required: false },
      {
        model: Trial,
        as: 'trial',
        required: true,
        attributes: ['id', 'studioId', 'title', 'state'],
        where: { state: { [Op.in]: [...REMINDING_TRIAL_STATES] } },
        include: [{ model: Milestone, as: 'milestones', attributes: ['id', 'kind', 'dueAt'] }, { model: Studio, as: 'studio', attributes: ['id', 'name', 'timeZone'] }],
      },
    ],
  });
  return rows as Loaded[];
}

/** Lets other work (requests to the API in the same process) run between chunks of a long sweep. */
/** Days ahead of now within which a due date can have a reminder due (3 days + the widest zone offset). */
const REMINDER_LOOKAHEAD_DAYS = 5;

const yieldToOthers = () => new Promise<void>((resolve) => setImmediate(resolve));
const CHUNK = 200;

const submitted = (e: Loaded, kind: MilestoneKind) => e.reports.some((r) => r.stage === STAGE_OF[kind] && r.submittedAt !== null);

/** Each unsubmitted tester milestone of an active enrollment, with the tester's own due time. */
function openItems(e: Loaded) {
  return TESTER_MILESTONES.flatMap((kind) => {
    const due = dueFor(e, e.trial.milestones, kind);
    return due && !submitted(e, kind) ? [{ kind, due }] : [];
  });
}

export type SweepResult = { queued: number; skipped: number };

function count(result: SweepResult, status: string | undefined) {
  if (status === 'queued') result.queued += 1;
  else if (status === 'skipped') result.skipped += 1;
}

/**
 * Records the reminders due at `now` for every active tester who has not submitted what a
 * milestone asks. Idempotent: the key names the enrollment, milestone, stage and due time, so
 * running it again (or in two processes) adds nothing, and a moved due date gets fresh keys.
 */
export async function sweepReminders(config: Config, now: Date, loaded?: Loaded[]): Promise<SweepResult> {
  const result: SweepResult = { queued: 0, skipped: 0 };
  let done = 0;
  for (const e of loaded ?? (await activeEnrollments(now))) {
    if (++done % CHUNK === 0) await yieldToOthers();
    for (const { kind, due } of openItems(e)) {
      const planned = reminderDueAt(due, e.user.timeZone, now);
      if (!planned) continue;
      const row = await enqueue(
        { config },
        {
          key: `reminder:${e.id}:${kind}:${planned.stage}:${due.toISOString()}`,
          to: { id: e.user.id, email: e.user.email },
          template: planned.stage === 'overdue' ? 'overdue' : `reminder-${planned.stage}`,
          category: 'reminders',
          studioId: e.trial.studioId,
          trialId: e.trial.id,
          enrollmentId: e.id,
          milestoneKind: kind,
          dueAt: due,
          content: reminderMail({
            name: e.user.name,
            trialTitle: e.trial.title,
            studioName: e.trial.studio?.name ?? '',
            link: `${config.publicUrl}/my-trials`,
            stage: planned.stage,
            what: WHAT_IS_DUE[kind] ?? kind,
            expectation: TESTER_EXPECTATIONS[kind] ?? '',
            dueText: formatDue(due, safeZone(e.user.timeZone)),
            daysLeft: daysUntil(due, now, e.user.timeZone),
            optOut: optOutFor(config, e.user.id, 'reminders'),
          }),
        },
        { now, preferenceOff: !e.user.mailReminders, reload: false },
      );
      count(result, row?.status);
    }
  }
  return result;
}

/**
 * Once a day, from 08:00 in the studio's time zone, the owner and coordinators get the list of
 * testers whose due time has passed without a submission. Nothing is sent on a day with none.
 */
export async function sweepDigests(config: Config, now: Date, loaded?: Loaded[]): Promise<SweepResult> {
  const result: SweepResult = { queued: 0, skipped: 0 };
  const byStudio = new Map<string, { studio: Studio; lines: DigestLine[] }>();
  let done = 0;
  for (const e of loaded ?? (await activeEnrollments(now))) {
    if (++done % CHUNK === 0) await yieldToOthers();
    const studio = e.trial.studio;
    if (!studio) continue;
    for (const { kind, due } of openItems(e)) {
      if (due > now) continue;
      const entry = byStudio.get(studio.id) ?? { studio, lines: [] };
      entry.lines.push({
        trialTitle: e.trial.title,
        tester: e.user.name,
        what: WHAT_IS_DUE[kind] ?? kind,
        dueText: formatDue(due, safeZone(studio.timeZone)),
        daysLate: daysLate(due, now, studio.timeZone),
      });
      byStudio.set(studio.id, entry);
    }
  }
  for (const { studio, lines } of byStudio.values()) {
    const day = digestDayAt(now, studio.timeZone);
    if (!day) continue;
    lines.sort((a, b) => a.trialTitle.localeCompare(b.trialTitle) || b.daysLate - a.daysLate || a.tester.localeCompare(b.tester));
    const staff = await Membership.findAll({ where: { studioId: studio.id, role: { [Op.in]: ['owner', 'coordinator'] } }, include: [{ model: User, as: 'user', required: true }] });
    for (const m of staff) {
      const user = m.user!;
      const row = await enqueue(
        { config },
        {
          key: `digest:${studio.id}:${user.id}:${day}`,
          to: { id: user.id, email: user.email },
          template: 'digest',
          category: 'digest',
          studioId: studio.id,
          content: digestMail({
            name: user.name,
            studioName: studio.name,
            dateText: new Intl.DateTimeFormat('en-GB', { dateStyle: 'full', timeZone: safeZone(studio.timeZone) }).format(now),
            lines,
            link: `${config.publicUrl}/trials`,
            optOut: optOutFor(config, user.id, 'digest'),
          }),
        },
        { now },
      );
      count(result, row?.status);
    }
  }
  return result;
}
