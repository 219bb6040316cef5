import dayjs from 'dayjs';
import timezone from 'dayjs/plugin/timezone';
import utc from 'dayjs/plugin/utc';
import type { ReminderStage } from '../mail/templates';

dayjs.extend(utc);
dayjs.extend(timezone);

/** Reminders and the digest go out from this hour of the reader's own morning. */
export const MORNING_HOUR = 8;

/** Days from the due date (in the tester's own calendar) on which each reminder goes out. */
export const REMINDER_STAGES: readonly { stage: ReminderStage; dayOffset: number }[] = [
  { stage: '3d', dayOffset: -3 },
  { stage: '1d', dayOffset: -1 },
  { stage: 'day', dayOffset: 0 },
  { stage: 'overdue', dayOffset: 2 },
];

export type PlannedReminder = { stage: ReminderStage; sendAt: Date; until: Date };

/** A zone the engine knows, else UTC: a bad stored value must not stop everyone's reminders. */
export function safeZone(timeZone: string): string {
  // Known per zone once: building a formatter to test a zone cost more than the rest of a reminder.
  let known = ZONES.get(timeZone);
  if (known === undefined) {
    try {
      new Intl.DateTimeFormat('en', { timeZone });
      known = timeZone;
    } catch {
      known = 'UTC';
    }
    ZONES.set(timeZone, known);
  }
  return known;
}
const ZONES = new Map<string, string>();

/** The calendar date (YYYY-MM-DD) of an instant in a zone. */
export function localDate(instant: Date, timeZone: string): string {
  return dayjs(instant).tz(safeZone(timeZone)).format('YYYY-MM-DD');
}

/** The instant of a wall-clock time on a calendar date in a zone (DST-aware). */
function at(date: string, hour: number, timeZone: string): Date {
  return dayjs.tz(`${date} ${String(hour).padStart(2, '0')}:00`, timeZone).toDate();
}

function shiftDate(date: string, days: number): string {
  return dayjs.utc(date).add(days, 'day').format('YYYY-MM-DD');
}

/**
 * When each reminder for one due time goes out: at 08:00 on the tester's own calendar day
 * 3 days before, 1 day before, on the day and 2 days after. Each is valid until the next one
 * starts; a reminder before the due time is never sent once the time has passed (a due time
 * earlier than 08:00 therefore has no "today" reminder), and the overdue one stays valid for
 * the rest of its local day, so a late tick does not send a burst of stale reminders.
 */
export function reminderPlan(dueAt: Date, timeZone: string): PlannedReminder[] {
  const zone = safeZone(timeZone);
  const dueDate = localDate(dueAt, zone);
  const sends = REMINDER_STAGES.map((s) => ({ stage: s.stage, sendAt: at(shiftDate(dueDate, s.dayOffset), MORNING_HOUR, zone), dayOffset: s.dayOffset }));
  return sends.flatMap((s, i) => {
    const next = sends[i + 1];
    const until =
      s.stage === 'overdue'
        ? at(shiftDate(dueDate, s.dayOffset + 1), 0, zone)
        : new Date(Math.min(next ? next.sendAt.getTime() : Infinity, dueAt.getTime()));
    return s.sendAt < until ? [{ stage: s.stage, sendAt: s.sendAt, until }] : [];
  });
}

/** The reminder that is due at this instant, if any. */
export function reminderDueAt(dueAt: Date, timeZone: string, now: Date): PlannedReminder | null {
  const due = reminderPlan(dueAt, timeZone).find((p) => p.sendAt <= now && now < p.until) ?? null;
  // An early reminder caught on the eve of the due day would repeat the "tomorrow" one of 08:00.
  if (due?.stage === '3d' && daysUntil(dueAt, now, timeZone) < 2) return null;
  return due;
}

/** The reminders still ahead of this instant (what the Mail screen shows as planned). */
export function upcomingReminders(dueAt: Date, timeZone: string, now: Date): PlannedReminder[] {
  return reminderPlan(dueAt, timeZone).filter((p) => p.sendAt > now);
}

/** The studio's calendar day whose digest is due at this instant: from 08:00 to midnight local. */
export function digestDayAt(now: Date, timeZone: string): string | null {
  const local = dayjs(now).tz(safeZone(timeZone));
  return local.hour() >= MORNING_HOUR ? local.format('YYYY-MM-DD') : null;
}

/** Whole calendar days between the due date and today, in a zone (0 when due earlier today). */
export function daysLate(dueAt: Date, now: Date, timeZone: string): number {
  return Math.max(0, dayjs.utc(localDate(now, timeZone)).diff(dayjs.utc(localDate(dueAt, timeZone)), 'day'));
}

/** Whole calendar days from today to the due date, in a zone (0 on the day, negative once past). */
export function daysUntil(dueAt: Date, now: Date, timeZone: string): number {
  return dayjs.utc(localDate(dueAt, timeZone)).diff(dayjs.utc(localDate(now, timeZone)), 'day');
}
