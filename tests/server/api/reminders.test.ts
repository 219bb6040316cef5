import request from 'supertest';
import { OutboxMessage, User } from '../../../db/models';
import { reminderPlan } from '../../../server/jobs/schedule';
import { runMailTick } from '../../../server/jobs/tick';
import { cancelObsoleteReminders } from '../../../server/outbox/outbox.service';
import { bearer } from '../../support/factories';
import { createTrialWorld, markSubmitted, startMailHarness, type MailHarness } from './mail-support';

/**
 * The reminder sweep with a clock of the test's choosing: `runMailTick(deps, now)` is what the
 * queue runs every few minutes with the real time. Mail goes to an SMTP server of this file's own.
 */
let h: MailHarness;
beforeAll(async () => {
  h = await startMailHarness();
});
afterAll(() => h.close());

const tick = (at: string) => runMailTick({ config: h.t.config, mailer: h.t.mailer }, new Date(at));
// Final report due 17:00 UTC on Thursday 10 December 2026 (see the unit test of the schedule).
const DUE = new Date('2026-12-10T17:00:00Z');
const ZONES = ['Europe/Lisbon', 'America/Los_Angeles', 'Pacific/Auckland'];

describe('reminders to testers', () => {
  it('go out at 08:00 in each tester’s own zone, once each, with a working opt-out link', async () => {
    const w = await createTrialWorld({ zones: ZONES, dues: { 'final-report': DUE } });
    const [lisbon, la, auckland] = w.testers.map((t) => t.user);

    await tick('2026-12-07T08:05:00Z');
    expect(h.capture.to(lisbon.email).map((m) => m.subject)).toEqual(['Due in 3 days: final report, Reminder trial']);
    expect(h.capture.to(la.email)).toEqual([]);
    expect(h.capture.to(auckland.email)).toEqual([]);

    // The same instant again (a second run, or a second instance): nothing new.
    await tick('2026-12-07T08:06:00Z');
    expect(h.capture.to(lisbon.email)).toHaveLength(1);

    await tick('2026-12-07T16:05:00Z');
    expect(h.capture.to(la.email).map((m) => m.subject)).toEqual(['Due in 3 days: final report, Reminder trial']);
    await tick('2026-12-07T19:05:00Z');
    expect(h.capture.to(auckland.email).map((m) => m.subject)).toEqual(['Due in 3 days: final report, Reminder trial']);

    // The due time is written in the tester's own zone.
    // Each in the tester's own zone, named.
    expect(h.capture.to(la.email)[0].text).toContain('Thursday, 10 December 2026 at 09:00 (America/Los_Angeles)');
    expect(h.capture.to(auckland.email)[0].text).toContain('Friday, 11 December 2026 at 06:00 (Pacific/Auckland)');

    // Day before, on the day, and two days late, each once; Auckland has no "today" mail (due 06:00 there).
    for (const at of ['2026-12-09T08:05:00Z', '2026-12-09T16:05:00Z', '2026-12-09T19:05:00Z', '2026-12-10T08:05:00Z', '2026-12-10T16:05:00Z', '2026-12-10T19:05:00Z']) {
      await tick(at);
    }
    for (const at of ['2026-12-12T08:05:00Z', '2026-12-12T16:05:00Z', '2026-12-12T19:05:00Z', '2026-12-12T19:10:00Z']) await tick(at);
    const subjects = (u: User) => h.capture.to(u.email).map((m) => m.subject.split(':')[0]);
    expect(subjects(lisbon)).toEqual(['Due in 3 days', 'Due tomorrow', 'Due today', 'Overdue']);
    expect(subjects(la)).toEqual(['Due in 3 days', 'Due tomorrow', 'Due today', 'Overdue']);
    expect(subjects(auckland)).toEqual(['Due in 3 days', 'Due tomorrow', 'Overdue']);

    const rows = await OutboxMessage.findAll({ where: { trialId: w.trial.id } });
    expect(rows).toHaveLength(11);
    expect(rows.every((r) => r.status === 'sent' && r.attempts === 1 && r.providerMessageId)).toBe(true);

    // The opt-out link in the mail asks first (opening it changes nothing), then its button
    // turns reminders off without signing in.
    const mail = h.capture.to(lisbon.email)[0];
    expect(mail.headers['list-unsubscribe']).toEqual(expect.stringContaining('/api/mail/opt-out/'));
    expect(mail.headers['list-unsubscribe-post']).toBe('List-Unsubscribe-Post: List-Unsubscribe=One-Click');
    const link = mail.text.match(/http:\/\/basted\.test(\/api\/mail\/opt-out\/\S+)/)![1];
    const page = await request(h.t.app).get(link);
    expect(page.status).toBe(200);
    expect(page.type).toBe('text/html');
    expect(page.text).toContain('You will no longer get reminders about due dates');
    expect((await User.findByPk(lisbon.id))!.mailReminders).toBe(true);
    await request(h.t.app).post(link).type('form').send({ confirm: 'stop' }).expect(200);
    expect((await User.findByPk(lisbon.id))!.mailReminders).toBe(false);
    expect((await User.findByPk(lisbon.id))!.mailTrialNews).toBe(true);
  });

  it('a tester who turned reminders off gets none: the outbox records them as skipped', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon', 'Europe/Lisbon'], dues: { 'final-report': DUE } });
    const [off, on] = w.testers.map((t) => t.user);
    await off.update({ mailReminders: false });
    await tick('2026-12-07T08:05:00Z');
    expect(h.capture.to(off.email)).toEqual([]);
    expect(h.capture.to(on.email)).toHaveLength(1);
    const skipped = await OutboxMessage.findOne({ where: { recipientId: off.id } });
    expect(skipped).toMatchObject({ status: 'skipped', attempts: 0, template: 'reminder-3d' });
    expect(skipped!.lastError).toMatch(/turned off reminders/);
  });

  it('a submitted report stops its reminders, including one queued for a retry', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon', 'Europe/Lisbon'], dues: { 'final-report': DUE } });
    const [done, late] = w.testers;
    await h.capture.stop();
    await tick('2026-12-07T08:05:00Z');
    const queued = await OutboxMessage.findOne({ where: { recipientId: done.user.id } });
    expect(queued).toMatchObject({ status: 'queued', attempts: 1 });
    await markSubmitted(done.enrollment, 'final', new Date('2026-12-08T10:00:00Z'));
    expect(await cancelObsoleteReminders({ enrollmentId: done.enrollment.id })).toBe(1);
    expect(await queued!.reload()).toMatchObject({ status: 'cancelled', lastError: 'Not sent: the tester has submitted it.' });
    await h.capture.start();

    await tick('2026-12-07T08:10:00Z');
    await tick('2026-12-09T08:05:00Z');
    await tick('2026-12-12T08:05:00Z');
    expect(h.capture.to(done.user.email)).toEqual([]);
    expect(h.capture.to(late.user.email).map((m) => m.subject.split(':')[0])).toEqual(['Due in 3 days', 'Due tomorrow', 'Overdue']);
  });

  it('submitting through the app cancels a reminder waiting for a retry', async () => {
    const due = new Date(Date.now() + 10 * 86_400_000);
    const w = await createTrialWorld({ zones: ['Europe/Lisbon'], dues: { 'final-report': due } });
    const [tester] = w.testers;
    const threeDays = reminderPlan(due, 'Europe/Lisbon')[0];
    await h.capture.stop();
    await tick(new Date(threeDays.sendAt.getTime() + 5 * 60_000).toISOString());
    await h.capture.start();
    const queued = (await OutboxMessage.findOne({ where: { recipientId: tester.user.id } }))!;
    expect(queued).toMatchObject({ status: 'queued', template: 'reminder-3d' });

    const url = `/api/me/enrollments/${tester.enrollment.id}/reports/final`;
    const auth = { Authorization: bearer(tester.user, h.t.config) };
    await request(h.t.app).put(url).set(auth).send({ baseVersion: 0, changes: { sizeSewn: 'M', draftVersion: 1, fit: { waist: 0 }, verdict: 'Fits well.' } }).expect(200);
    expect((await request(h.t.app).post(`${url}/submit`).set(auth)).status).toBe(200);
    expect(await queued.reload()).toMatchObject({ status: 'cancelled', lastError: 'Not sent: the tester has submitted it.' });
    await tick(new Date(threeDays.sendAt.getTime() + 10 * 60_000).toISOString());
    expect(h.capture.to(tester.user.email)).toEqual([]);
  });

  it('a withdrawal cancels the queued reminder and stops the rest', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon'], dues: { 'final-report': DUE } });
    const [leaving] = w.testers;
    await h.capture.stop();
    await tick('2026-12-07T08:05:00Z');
    await h.capture.start();
    const res = await request(h.t.app).post(`/api/me/applications/${leaving.application.id}/withdraw`).set('Authorization', bearer(leaving.user, h.t.config));
    expect(res.status).toBe(200);
    expect(await OutboxMessage.findOne({ where: { recipientId: leaving.user.id } })).toMatchObject({ status: 'cancelled', lastError: 'Not sent: the tester is no longer active in the trial.' });
    await tick('2026-12-07T08:10:00Z');
    await tick('2026-12-09T08:05:00Z');
    expect(h.capture.to(leaving.user.email)).toEqual([]);
  });

  it('more time for one tester moves their reminders; a new trial date moves everyone else’s', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon', 'Europe/Lisbon'], dues: { 'final-report': DUE } });
    const [extended, other] = w.testers;
    const auth = { Authorization: bearer(w.coordinator, h.t.config) };
    const base = `/api/studios/${w.studio.id}/trials/${w.trial.id}`;
    const moved = await request(h.t.app).patch(`${base}/enrollments/${extended.enrollment.id}/due`).set(auth).send({ kind: 'final-report', dueAt: '2026-12-20T17:00:00Z' });
    expect(moved.status).toBe(200);

    await tick('2026-12-07T08:05:00Z');
    expect(h.capture.to(extended.user.email)).toEqual([]);
    expect(h.capture.to(other.user.email)).toHaveLength(1);

    // The whole trial moves a week later: the other tester's next reminder follows the new date.
    const patched = await request(h.t.app).patch(base).set(auth).send({ milestones: { 'final-report': '2026-12-17T17:00:00Z' } });
    expect(patched.status).toBe(200);
    await tick('2026-12-09T08:05:00Z'); // the old "due tomorrow"
    expect(h.capture.to(other.user.email)).toHaveLength(1);
    await tick('2026-12-14T08:05:00Z');
    expect(h.capture.to(other.user.email).map((m) => m.subject.split(':')[0])).toEqual(['Due in 3 days', 'Due in 3 days']);
    expect(h.capture.to(other.user.email)[1].text).toContain('Thursday, 17 December 2026');
    await tick('2026-12-17T08:05:00Z');
    expect(h.capture.to(extended.user.email).map((m) => m.subject.split(':')[0])).toEqual(['Due in 3 days']);
    expect(h.capture.to(extended.user.email)[0].text).toContain('Sunday, 20 December 2026');
  });
});

describe('daily digest to the studio', () => {
  it('lists overdue testers to the owner and coordinators once a day, from 08:00 in the studio’s zone', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon', 'America/Los_Angeles', 'Pacific/Auckland'], dues: { 'toile-check-in': new Date('2026-11-20T17:00:00Z'), 'final-report': DUE } });
    await markSubmitted(w.testers[0].enrollment, 'check-in');
    await markSubmitted(w.testers[0].enrollment, 'final');

    await tick('2026-12-11T07:55:00Z'); // before 08:00 in Lisbon
    expect(h.capture.to(w.owner.email)).toEqual([]);
    await tick('2026-12-11T08:05:00Z');
    await tick('2026-12-11T12:00:00Z');
    for (const staff of [w.owner, w.coordinator]) {
      const mails = h.capture.to(staff.email);
      expect(mails.map((m) => m.subject)).toEqual(['Overdue in Reminder studio: 4 items']);
      // Times in the studio's zone, named.
      expect(mails[0].text).toMatch(/Tester America\/Los_Angeles, toile check-in, due Friday, 20 November 2026 at 17:00 \(Europe\/Lisbon\) \(21 days late\)/);
      expect(mails[0].text).toMatch(/Tester Pacific\/Auckland, final report, due Thursday, 10 December 2026 at 17:00 \(Europe\/Lisbon\) \(1 day late\)/);
      expect(mails[0].text).not.toContain('Tester Europe/Lisbon');
    }
    // The next morning brings the next day's list; a coordinator who turned it off gets a skipped row.
    await w.coordinator.update({ mailDigest: false });
    await tick('2026-12-12T08:05:00Z');
    expect(h.capture.to(w.owner.email)).toHaveLength(2);
    expect(h.capture.to(w.coordinator.email)).toHaveLength(1);
    expect(await OutboxMessage.findOne({ where: { recipientId: w.coordinator.id, status: 'skipped' } })).toMatchObject({ template: 'digest', category: 'digest' });
  });
});
