import { daysLate, daysUntil, digestDayAt, reminderDueAt, reminderPlan, upcomingReminders } from '../../../server/jobs/schedule';
import { reminderMail } from '../../../server/mail/templates';

const iso = (d: Date) => d.toISOString();
const plan = (due: string, zone: string) => reminderPlan(new Date(due), zone).map((p) => ({ stage: p.stage, sendAt: iso(p.sendAt), until: iso(p.until) }));

describe('reminder schedule in the tester’s own time zone', () => {
  // Due 17:00 UTC on 10 December 2026: a Thursday afternoon in Lisbon, the morning in Los
  // Angeles, and already Friday 06:00 in Auckland (UTC+13 in summer time).
  const due = '2026-12-10T17:00:00.000Z';

  it('Lisbon (UTC+0 in winter): 08:00 local on the 7th, 9th, 10th and 12th', () => {
    expect(plan(due, 'Europe/Lisbon')).toEqual([
      { stage: '3d', sendAt: '2026-12-07T08:00:00.000Z', until: '2026-12-09T08:00:00.000Z' },
      { stage: '1d', sendAt: '2026-12-09T08:00:00.000Z', until: '2026-12-10T08:00:00.000Z' },
      { stage: 'day', sendAt: '2026-12-10T08:00:00.000Z', until: due },
      { stage: 'overdue', sendAt: '2026-12-12T08:00:00.000Z', until: '2026-12-13T00:00:00.000Z' },
    ]);
  });

  it('Los Angeles (UTC−8): 08:00 Pacific time is 16:00 UTC; the “today” reminder has an hour before the 09:00 deadline', () => {
    expect(plan(due, 'America/Los_Angeles')).toEqual([
      { stage: '3d', sendAt: '2026-12-07T16:00:00.000Z', until: '2026-12-09T16:00:00.000Z' },
      { stage: '1d', sendAt: '2026-12-09T16:00:00.000Z', until: '2026-12-10T16:00:00.000Z' },
      { stage: 'day', sendAt: '2026-12-10T16:00:00.000Z', until: due },
      { stage: 'overdue', sendAt: '2026-12-12T16:00:00.000Z', until: '2026-12-13T08:00:00.000Z' },
    ]);
  });

  it('Auckland (UTC+13): the due date is the 11th there, so “3 days before” is the 8th; no “today” mail after the 06:00 deadline', () => {
    expect(plan(due, 'Pacific/Auckland')).toEqual([
      { stage: '3d', sendAt: '2026-12-07T19:00:00.000Z', until: '2026-12-09T19:00:00.000Z' },
      { stage: '1d', sendAt: '2026-12-09T19:00:00.000Z', until: due },
      { stage: 'overdue', sendAt: '2026-12-12T19:00:00.000Z', until: '2026-12-13T11:00:00.000Z' },
    ]);
  });

  it('counts days on the local calendar across a change to summer time (Lisbon, 28 March 2027)', () => {
    const [threeDays, oneDay] = plan('2027-03-30T12:00:00Z', 'Europe/Lisbon');
    expect(threeDays).toMatchObject({ stage: '3d', sendAt: '2027-03-27T08:00:00.000Z' }); // 08:00 WET
    expect(oneDay).toMatchObject({ stage: '1d', sendAt: '2027-03-29T07:00:00.000Z' }); // 08:00 WEST
  });

  it('at 08:05 UTC on the 7th only the Lisbon tester is due a reminder', () => {
    const now = new Date('2026-12-07T08:05:00Z');
    expect(reminderDueAt(new Date(due), 'Europe/Lisbon', now)?.stage).toBe('3d');
    expect(reminderDueAt(new Date(due), 'America/Los_Angeles', now)).toBeNull();
    expect(reminderDueAt(new Date(due), 'Pacific/Auckland', now)).toBeNull();
    expect(reminderDueAt(new Date(due), 'Pacific/Auckland', new Date('2026-12-07T19:00:00Z'))?.stage).toBe('3d');
  });

  it('a tick late in a window sends the current reminder only, never a stale one; none between the deadline and the overdue one', () => {
    const d = new Date(due);
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-09T23:00:00Z'))?.stage).toBe('1d');
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-10T16:59:00Z'))?.stage).toBe('day');
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-10T17:00:00Z'))).toBeNull();
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-11T12:00:00Z'))).toBeNull();
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-12T23:59:00Z'))?.stage).toBe('overdue');
    expect(reminderDueAt(d, 'Europe/Lisbon', new Date('2026-12-13T00:00:00Z'))).toBeNull();
  });

  it('an unknown zone falls back to UTC instead of failing', () => {
    expect(plan(due, 'Not/AZone')[0]).toMatchObject({ stage: '3d', sendAt: '2026-12-07T08:00:00.000Z' });
  });

  it('lists what is still ahead', () => {
    expect(upcomingReminders(new Date(due), 'Europe/Lisbon', new Date('2026-12-09T09:00:00Z')).map((p) => p.stage)).toEqual(['day', 'overdue']);
  });
});

describe('digest day and lateness in the studio’s zone', () => {
  it('the digest day starts at 08:00 local', () => {
    expect(digestDayAt(new Date('2026-12-10T07:59:00Z'), 'Europe/Lisbon')).toBeNull();
    expect(digestDayAt(new Date('2026-12-10T08:00:00Z'), 'Europe/Lisbon')).toBe('2026-12-10');
    // 08:00 in Auckland on the 11th is 19:00 UTC on the 10th.
    expect(digestDayAt(new Date('2026-12-10T19:00:00Z'), 'Pacific/Auckland')).toBe('2026-12-11');
  });

  it('days late count calendar days in the zone', () => {
    expect(daysLate(new Date('2026-12-10T17:00:00Z'), new Date('2026-12-10T20:00:00Z'), 'Europe/Lisbon')).toBe(0);
    expect(daysLate(new Date('2026-12-10T17:00:00Z'), new Date('2026-12-12T08:00:00Z'), 'Europe/Lisbon')).toBe(2);
  });
});

describe('the early reminder says how many days are really left', () => {
  // Due 2026-12-03 at 12:00 in Los Angeles (20:00 UTC). The early reminder's window runs from
  // 08:00 three local days before until the "tomorrow" one at 08:00 on 2 December local.
  const due = new Date('2026-12-03T20:00:00Z');
  const zone = 'America/Los_Angeles';

  it('counts calendar days in the tester’s zone', () => {
    expect(daysUntil(due, new Date('2026-11-30T16:05:00Z'), zone)).toBe(3); // 08:05 on 30 Nov in LA
    expect(daysUntil(due, new Date('2026-12-01T09:00:00Z'), zone)).toBe(2); // 01:00 on 1 Dec in LA
    expect(daysUntil(due, new Date('2026-12-02T08:05:00Z'), zone)).toBe(1); // 00:05 on 2 Dec in LA
    expect(daysUntil(due, new Date('2026-12-03T17:00:00Z'), zone)).toBe(0);
  });

  it('a tester chosen late gets “in 2 days”, not “in 3 days”', () => {
    const late = new Date('2026-12-01T09:00:00Z'); // 01:00 on 1 Dec in LA: inside the early window
    expect(reminderDueAt(due, zone, late)?.stage).toBe('3d');
    const base = { name: 'Ada', trialTitle: 'Wide-leg trousers', studioName: 'Studio', link: 'http://basted.test/my-trials', stage: '3d' as const, what: 'final report', expectation: '', dueText: '3 Dec 2026, 12:00' };
    const mail = reminderMail({ ...base, daysLeft: daysUntil(due, late, zone) });
    expect(mail.subject).toBe('Due in 2 days: final report, Wide-leg trousers');
    expect(mail.text).toMatch(/is due in two days, on 3 Dec 2026, 12:00/);
    expect(reminderMail({ ...base, daysLeft: 3 }).subject).toBe('Due in 3 days: final report, Wide-leg trousers');
    // Still inside the early window at 00:05 on the eve of the due day, but the "tomorrow" one
    // comes at 08:00: nothing is sent before it.
    expect(reminderDueAt(due, zone, new Date('2026-12-02T08:05:00Z'))).toBeNull();
    expect(reminderDueAt(due, zone, new Date('2026-12-02T16:05:00Z'))?.stage).toBe('1d');
  });
});
