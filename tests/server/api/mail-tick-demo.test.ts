import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import { Op } from 'sequelize';
import { Enrollment, Milestone, OutboxMessage, Report, Trial, User } from '../../../db/models';
import { DEMO_ACCOUNTS, DEMO_TRIAL_SLUG, seedDemoStudio } from '../../../db/seeders/demo-studio';
import { reminderPlan } from '../../../server/jobs/schedule';
import { runMailTick } from '../../../server/jobs/tick';
import { startMailHarness, type MailHarness } from './mail-support';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../../..');

/**
 * What a person does by hand against the running services: load the demo, then move the clock
 * with `npm run -s mail:tick -- --at …` and read the inbox. Here the command runs against this
 * file's own database and an SMTP server of its own.
 */
let h: MailHarness;
beforeAll(async () => {
  h = await startMailHarness();
  await seedDemoStudio(h.t.sequelize, 4);
}, 120_000);
afterAll(() => h.close());

const tickAt = async (at: Date) => {
  const env = { ...process.env, DATABASE_URL: h.databaseUrl, SMTP_PORT: String(h.capture.port), PUBLIC_URL: 'http://basted.test' };
  const { stdout } = await run(process.execPath, ['--import', 'tsx', 'scripts/mail-tick.ts', '--at', at.toISOString()], { cwd: ROOT, env, timeout: 60_000 });
  return JSON.parse(stdout) as { reminders: { queued: number }; digests: { queued: number } };
};

describe('the demo trial and the mail:tick command', () => {
  it('moving the clock sends each stage of reminder once to each tester who has not sent the final report, and none to those who have', async () => {
    const trial = (await Trial.findOne({ where: { slug: DEMO_TRIAL_SLUG } }))!;
    const due = (await Milestone.findOne({ where: { trialId: trial.id, kind: 'final-report' } }))!.dueAt;
    const enrollments = await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: User, as: 'user' }] });
    const submitted = new Set((await Report.findAll({ where: { stage: 'final', submittedAt: { [Op.ne]: null }, enrollmentId: enrollments.map((e) => e.id) } })).map((r) => r.enrollmentId));
    const email = (e: Enrollment) => (e as Enrollment & { user: User }).user.email;
    const owed = enrollments.filter((e) => e.status === 'active' && !submitted.has(e.id) && !e.dueOverrides['final-report']).map(email);
    const done = enrollments.filter((e) => submitted.has(e.id)).map(email);
    expect(owed.length).toBeGreaterThan(0);
    expect(done.length).toBeGreaterThan(0);

    // The demo testers live in several zones: each one's reminders fall on their own mornings.
    const zoneOf = new Map(enrollments.map((e) => [email(e), (e as Enrollment & { user: User }).user.timeZone]));
    expect(new Set(owed.map((a) => zoneOf.get(a))).size).toBeGreaterThan(1);
    const plans = new Map(owed.map((a) => [a, reminderPlan(due, zoneOf.get(a)!)]));
    const instants = [...new Set([...plans.values()].flat().map((p) => p.sendAt.getTime() + 5 * 60_000))].sort((a, b) => a - b);
    // The command itself at the first instant (twice: nothing more goes out); the same tick
    // in-process for the rest, which keeps the test quick when the testers' zones spread the plan.
    const [firstAt, ...rest] = instants;
    await tickAt(new Date(firstAt));
    expect((await tickAt(new Date(firstAt))).reminders.queued).toBe(0);
    for (const at of rest) {
      await runMailTick({ config: h.t.config, mailer: h.t.mailer }, new Date(at));
      await runMailTick({ config: h.t.config, mailer: h.t.mailer }, new Date(at));
    }
    const subject = { '3d': 'Due in 3 days', '1d': 'Due tomorrow', day: 'Due today', overdue: 'Overdue' } as const;
    for (const address of owed) {
      const expected = plans.get(address)!.map((p) => subject[p.stage]);
      expect(expected.length).toBeGreaterThan(0);
      expect(h.capture.to(address).map((m) => m.subject.split(':')[0])).toEqual(expected);
    }
    for (const address of done) expect(h.capture.to(address).filter((m) => m.subject.includes('final report'))).toEqual([]);

    // The studio's owner and coordinator got one list of overdue testers on each morning that had one.
    const digestTo = (role: string) => h.capture.to(DEMO_ACCOUNTS.find((a) => a.role === role)!.email).filter((m) => m.subject.startsWith('Overdue in'));
    expect(digestTo('owner').length).toBeGreaterThan(0);
    expect(digestTo('coordinator')).toHaveLength(digestTo('owner').length);
    expect(digestTo('grader')).toEqual([]);
    const rows = await OutboxMessage.findAll({ where: { trialId: trial.id, category: 'reminders' } });
    expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
  });
});
