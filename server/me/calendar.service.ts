import { createHmac, timingSafeEqual } from 'node:crypto';
import icalGenerator, { ICalAlarmType } from 'ical-generator';
import { Op } from 'sequelize';
import { CalendarFeed, Enrollment, Milestone, Report, Studio, Trial, User } from '../../db/models';
import type { Config } from '../config';
import { MILESTONE_LABELS, TESTER_EXPECTATIONS, TESTER_MILESTONES } from '../domain/trials';
import { badRequest, notFound } from '../errors';

const PURPOSE = 'calendar-feed';
const STAGE_OF = { 'toile-check-in': 'check-in', 'final-report': 'final' } as const;

// A key of its own, derived from the session secret, so a feed address can never pass for
// anything else (a session, an opt-out link).
function signature(auth: Config['auth'], feedId: string): string {
  return createHmac('sha256', `${auth.jwtSecret}:${PURPOSE}`).update(feedId).digest('base64url').slice(0, 32);
}

export function feedUrl(config: Config, feed: CalendarFeed): string {
  return `${config.publicUrl}/api/calendar/${feed.id}.${signature(config.auth, feed.id)}.ics`;
}

const FEED_TOKEN = /^([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})\.([A-Za-z0-9_-]{32})(?:\.ics)?$/;

/** Whether an address has the shape of a feed address Basted gives out. */
export function isFeedToken(token: string): boolean {
  return FEED_TOKEN.test(token);
}

/** The person whose feed this address is, or null for an address that is wrong or was replaced. */
export async function feedOwner(token: string, auth: Config['auth']): Promise<User | null> {
  const match = FEED_TOKEN.exec(token);
  if (!match) return null;
  const [, id, mac] = match;
  const expected = Buffer.from(signature(auth, id));
  if (!timingSafeEqual(expected, Buffer.from(mac))) return null;
  const feed = await CalendarFeed.findByPk(id, { include: [{ model: User, as: 'user' }] });
  const user = (feed as (CalendarFeed & { user?: User }) | null)?.user;
  return user && !user.deletedAt ? user : null;
}

export async function myFeed(config: Config, user: User) {
  const feed = await CalendarFeed.findOne({ where: { userId: user.id } });
  return { feedUrl: feed ? feedUrl(config, feed) : null };
}

/** A new private address; the old one stops working at once. */
export async function renewFeed(config: Config, user: User) {
  const feed = await CalendarFeed.sequelize!.transaction(async (transaction) => {
    await CalendarFeed.destroy({ where: { userId: user.id }, transaction });
    return CalendarFeed.create({ userId: user.id }, { transaction });
  });
  return { feedUrl: feedUrl(config, feed) };
}

export async function stopFeed(user: User) {
  await CalendarFeed.destroy({ where: { userId: user.id } });
}

/**
 * A tester's due dates as an iCalendar (RFC 5545) calendar: one event per report they owe in each
 * trial they are in (their own date when the studio gave them more time), at the due time, with a
 * reminder a day before. Each event keeps its UID across downloads, so a calendar app updates it
 * when a date moves rather than adding a second one. A report already sent says so.
 */
export async function calendarFor(config: Config, user: User): Promise<string> {
  const enrollments = (await Enrollment.findAll({
    where: { userId: user.id, status: { [Op.in]: ['active', 'finished'] } },
    include: [
      { model: Trial, as: 'trial', include: [{ model: Milestone, as: 'milestones' }] },
      { model: Report, as: 'reports' },
    ],
  })) as (Enrollment & { trial: Trial; reports?: Report[] })[];
  const studios = new Map((await Studio.findAll({ where: { id: [...new Set(enrollments.map((e) => e.trial.studioId))] } })).map((s) => [s.id, s.name]));
  const calendar = icalGenerator({
    name: 'Basted: my due dates',
    description: 'The reports you owe in the fit trials you test for.',
    prodId: { company: 'Basted', product: 'due-dates', language: 'EN' },
    ttl: 60 * 60,
  });
  const link = `${config.publicUrl}/my-trials`;
  for (const e of enrollments) {
    for (const kind of TESTER_MILESTONES) {
      const milestone = e.trial.milestones?.find((m) => m.kind === kind);
      if (!milestone) continue;
      const due = e.dueOverrides[kind] ? new Date(e.dueOverrides[kind]) : milestone.dueAt;
      const sent = (e.reports ?? []).find((r) => r.stage === STAGE_OF[kind as keyof typeof STAGE_OF] && r.submittedAt);
      if (e.excusedAt && !sent) continue;
      const event = calendar.createEvent({
        id: `${e.id}-${kind}@basted`,
        start: due,
        end: new Date(due.getTime() + 30 * 60_000),
        summary: `${sent ? 'Sent: ' : ''}${MILESTONE_LABELS[kind]}: ${e.trial.title}`,
        description: `${studios.get(e.trial.studioId) ?? ''}: ${TESTER_EXPECTATIONS[kind] ?? ''}${sent ? `\nYou sent it on ${sent.submittedAt!.toISOString().slice(0, 10)}.` : ''}\n${link}`,
        url: link,
        stamp: e.updatedAt > milestone.updatedAt ? e.updatedAt : milestone.updatedAt,
      });
      if (!sent) event.createAlarm({ type: ICalAlarmType.display, trigger: 24 * 60 * 60, description: `${MILESTONE_LABELS[kind]} tomorrow: ${e.trial.title}` });
    }
  }
  return calendar.toString();
}

export function assertFeedOwner(token: string, user: User | null): User {
  if (!isFeedToken(token)) throw badRequest('This is not a calendar address Basted gives out.', { token: 'is not a calendar address' });
  // A replaced or stopped address answers like one that never existed.
  if (!user) throw notFound('calendar (the address was replaced or stopped; copy the new one from My trials)');
  return user;
}
