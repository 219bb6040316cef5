import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import request from 'supertest';
import { Invitation, OutboxMessage, User } from '../../../db/models';
import { runMailTick } from '../../../server/jobs/tick';
import { optOutUrl } from '../../../server/mail/opt-out';
import { enqueue, flushOutbox, MAX_ATTEMPTS } from '../../../server/outbox/outbox.service';
import { bearer, createUser, uniqueEmail } from '../../support/factories';
import { buildTestApp } from '../../support/test-app';
import { createTrialWorld, startMailHarness, type MailHarness } from './mail-support';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../../..');

let h: MailHarness;
beforeAll(async () => {
  h = await startMailHarness();
});
afterAll(() => h.close());

const deps = () => ({ config: h.t.config, mailer: h.t.mailer });
const DUE = new Date('2026-12-10T17:00:00Z');
const THREE_DAYS_BEFORE = new Date('2026-12-07T08:05:00Z');
const later = (from: Date, minutes: number) => new Date(from.getTime() + minutes * 60_000);

describe('the outbox', () => {
  it('when the SMTP server is down and comes back, every due message is delivered exactly once', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon', 'Europe/Lisbon', 'Europe/Lisbon'], dues: { 'final-report': DUE } });
    await h.capture.stop();
    const first = await runMailTick(deps(), THREE_DAYS_BEFORE);
    expect(first.delivered.filter((d) => w.testers.some((t) => t.user.email === d.to)).map((d) => d.status)).toEqual(['queued', 'queued', 'queued']);
    const rows = await OutboxMessage.findAll({ where: { trialId: w.trial.id } });
    expect(rows.map((r) => [r.status, r.attempts])).toEqual([['queued', 1], ['queued', 1], ['queued', 1]]);
    expect(rows[0].lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(rows[0].nextAttemptAt.toISOString()).toBe(later(THREE_DAYS_BEFORE, 1).toISOString());

    await h.capture.start();
    // Not before its back-off has passed…
    await runMailTick(deps(), later(THREE_DAYS_BEFORE, 0.5));
    expect(w.testers.flatMap((t) => h.capture.to(t.user.email))).toEqual([]);
    // …then once, however often the clock ticks.
    for (const m of [1, 2, 5, 60]) await runMailTick(deps(), later(THREE_DAYS_BEFORE, m));
    for (const t of w.testers) expect(h.capture.to(t.user.email).map((m) => m.subject)).toEqual(['Due in 3 days: final report, Reminder trial']);
    const settled = await OutboxMessage.findAll({ where: { trialId: w.trial.id } });
    expect(settled.map((r) => [r.status, r.attempts])).toEqual([['sent', 2], ['sent', 2], ['sent', 2]]);
  });

  it(`gives up after ${MAX_ATTEMPTS} attempts with growing waits, shows the reason, and a coordinator can resend it`, async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon'], dues: { 'final-report': DUE } });
    const tester = w.testers[0].user;
    await h.capture.stop();
    const start = new Date('2026-12-07T08:00:00Z');
    await runMailTick(deps(), start);
    const row = (await OutboxMessage.findOne({ where: { recipientId: tester.id } }))!;
    const waits: number[] = [];
    let clock = start;
    for (let i = 0; i < MAX_ATTEMPTS + 2 && (await row.reload()).status === 'queued'; i += 1) {
      waits.push((row.nextAttemptAt.getTime() - clock.getTime()) / 60_000);
      clock = row.nextAttemptAt;
      await flushOutbox(deps(), clock);
    }
    expect(waits).toEqual([1, 5, 15, 60]);
    expect(row).toMatchObject({ status: 'failed', attempts: MAX_ATTEMPTS });
    expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
    await flushOutbox(deps(), later(clock, 24 * 60));
    expect((await row.reload()).attempts).toBe(MAX_ATTEMPTS);

    const base = `/api/studios/${w.studio.id}/trials/${w.trial.id}/mail`;
    const auth = { Authorization: bearer(w.coordinator, h.t.config) };
    const list = await request(h.t.app).get(base).set(auth);
    expect(list.status).toBe(200);
    expect(list.body.messages).toEqual([
      expect.objectContaining({ id: row.id, status: 'failed', attempts: MAX_ATTEMPTS, canResend: true, template: 'reminder-3d', to: { name: tester.name, email: tester.email } }),
    ]);
    expect(list.body.messages[0].lastError).toMatch(/ECONNREFUSED|connect/i);

    await h.capture.start();
    const resent = await request(h.t.app).post(`${base}/${row.id}/resend`).set(auth);
    expect(resent.status).toBe(200);
    expect(resent.body).toMatchObject({ id: row.id, status: 'sent', attempts: 1, canResend: false });
    expect(h.capture.to(tester.email)).toHaveLength(1);
    const again = await request(h.t.app).post(`${base}/${row.id}/resend`).set(auth);
    expect(again.status).toBe(409);
    expect(again.body.error.fields).toEqual({ status: 'is sent' });
    expect(h.capture.to(tester.email)).toHaveLength(1);

    // A message of another trial cannot be reached through this one.
    const other = await createTrialWorld({ zones: [], dues: {} });
    const foreign = await request(h.t.app).post(`/api/studios/${other.studio.id}/trials/${other.trial.id}/mail/${row.id}/resend`).set({ Authorization: bearer(other.coordinator, h.t.config) });
    expect(foreign.status).toBe(404);
  });

  it('two worker processes on the same database send each message once', async () => {
    const w = await createTrialWorld({ zones: Array.from({ length: 12 }, () => 'Europe/Lisbon'), dues: { 'final-report': DUE } });
    // Plus messages already waiting in the queue, so both workers race for the same rows.
    const extra = await Promise.all(
      Array.from({ length: 120 }, (_, i) =>
        enqueue(deps(), { key: `worker-race:${w.trial.id}:${i}`, to: { id: null, email: `race-${i}-${w.trial.id.slice(0, 8)}@example.test` }, template: 'test', category: 'essential', trialId: w.trial.id, content: { subject: `Race ${i}`, text: 'race', html: '<p>race</p>' } }, { now: new Date('2026-12-07T08:00:00Z') }),
      ),
    );
    const env = { ...process.env, DATABASE_URL: h.databaseUrl, SMTP_PORT: String(h.capture.port), PUBLIC_URL: 'http://basted.test' };
    const worker = () => run(process.execPath, ['--import', 'tsx', 'scripts/mail-tick.ts', '--at', '2026-12-07T08:05:00Z'], { cwd: ROOT, env, timeout: 60_000 });
    const [a, b] = await Promise.all([worker(), worker()]);
    const results = [JSON.parse(a.stdout), JSON.parse(b.stdout)];

    for (const t of w.testers) expect(h.capture.to(t.user.email)).toHaveLength(1);
    for (const row of extra) expect(h.capture.to(row!.recipientEmail)).toHaveLength(1);
    const rows = await OutboxMessage.findAll({ where: { trialId: w.trial.id } });
    expect(rows).toHaveLength(132);
    expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
    // Between them the two processes settled each row once.
    const settledIds = results.flatMap((r: { delivered: { id: string }[] }) => r.delivered.map((d) => d.id)).filter((id: string) => rows.some((r) => r.id === id));
    expect(settledIds.sort()).toEqual(rows.map((r) => r.id).sort());
  });

  it('a message left "sending" by a process that died is marked failed, never sent again; a send in progress is left alone', async () => {
    const make = async (n: string) => (await enqueue(deps(), { key: `stale:${n}:${Date.now()}`, to: { id: null, email: `stale-${n}@example.test` }, template: 'test', category: 'essential', content: { subject: `Stale ${n}`, text: 'x', html: 'x' } }))!;
    const dead = await make('dead');
    const busy = await make('busy');
    await h.t.sequelize.query(`UPDATE outbox_messages SET status = 'sending', attempts = 1, claimed_at = now() - interval '20 minutes' WHERE id = $1`, { bind: [dead.id] });
    await h.t.sequelize.query(`UPDATE outbox_messages SET status = 'sending', attempts = 1, claimed_at = now() WHERE id = $1`, { bind: [busy.id] });
    // Even a clock moved a year ahead does not touch the send still in progress.
    const result = await runMailTick(deps(), later(new Date(), 365 * 24 * 60));
    expect(result.staleFailed).toBe(1);
    expect(await dead.reload()).toMatchObject({ status: 'failed', attempts: 1, lastError: expect.stringContaining('unknown whether the message left') });
    expect(await busy.reload()).toMatchObject({ status: 'sending', attempts: 1 });
    expect(h.capture.to('stale-dead@example.test')).toEqual([]);
  });

  it('the mail:tick command refuses an instant without its offset', async () => {
    const failed = await run(process.execPath, ['--import', 'tsx', 'scripts/mail-tick.ts', '--at', '2026-12-03 08:05'], { cwd: ROOT, env: { ...process.env, DATABASE_URL: h.databaseUrl } }).catch((e: { code: number; stderr: string }) => e);
    expect(failed).toMatchObject({ code: 2 });
    expect((failed as { stderr: string }).stderr).toContain('--at needs an instant with its offset');
  });
});

describe('existing mail goes through the outbox', () => {
  it('a decision mail is recorded and delivered at once', async () => {
    const w = await createTrialWorld({ zones: ['Europe/Lisbon'], dues: {} });
    const app = w.testers[0].application;
    await app.update({ status: 'applied' });
    const res = await request(h.t.app)
      .post(`/api/studios/${w.studio.id}/trials/${w.trial.id}/decisions`)
      .set({ Authorization: bearer(w.coordinator, h.t.config) })
      .send({ applicationIds: [app.id], status: 'declined' });
    expect(res.status).toBe(200);
    const row = await OutboxMessage.findOne({ where: { trialId: w.trial.id, template: 'declined' } });
    expect(row).toMatchObject({ status: 'sent', attempts: 1, category: 'trial-news', recipientEmail: w.testers[0].user.email });
    expect(h.capture.to(w.testers[0].user.email).map((m) => m.subject)).toEqual(['About your application: Reminder trial']);
    expect(h.capture.to(w.testers[0].user.email)[0].text).toContain('Stop news about trials you applied to: http://basted.test/api/mail/opt-out/');
  });

  it('a password reset is recorded, sent once, and its secret link is not kept', async () => {
    const user = await createUser('reset');
    const res = await request(h.t.app).post('/api/auth/password-reset').send({ email: user.email });
    expect(res.status).toBeLessThan(300);
    // The reset is prepared and sent after the answer (which must not depend on the address).
    let row: OutboxMessage | null = null;
    for (let i = 0; i < 100 && row?.status !== 'sent'; i += 1) {
      if (i) await new Promise((r) => setTimeout(r, 50));
      row = await OutboxMessage.findOne({ where: { recipientId: user.id, template: 'password-reset' } });
    }
    expect(row).toMatchObject({ status: 'sent', category: 'essential', text: null, html: null, attempts: 1 });
    expect(h.capture.to(user.email)[0].text).toContain('/reset-password?token=');
    // Essential mail has no opt-out link.
    expect(h.capture.to(user.email)[0].text).not.toContain('opt-out');
  });

  it('an invitation that cannot be sent leaves a failed record and nothing else', async () => {
    const w = await createTrialWorld({ zones: [], dues: {} });
    const down = buildTestApp({ SMTP_PORT: '9' });
    try {
      const email = uniqueEmail('nomail');
      const res = await request(down.app).post(`/api/studios/${w.studio.id}/invitations`).set({ Authorization: bearer(w.owner, down.config) }).send({ email, role: 'tester' });
      expect(res.status).toBe(503);
      expect(await Invitation.count({ where: { email } })).toBe(0);
      const row = await OutboxMessage.findOne({ where: { recipientEmail: email } });
      expect(row).toMatchObject({ status: 'failed', template: 'invitation', attempts: 1, text: null });
      // Failed essential mail is not retried: its link died with the rollback.
      await flushOutbox(deps(), later(new Date(), 120));
      expect((await row!.reload()).attempts).toBe(1);
    } finally {
      await down.close();
    }
  });

  it('trial news to someone who turned it off is recorded as skipped and never sent', async () => {
    const user = await createUser('quiet');
    await user.update({ mailTrialNews: false });
    const row = await enqueue(deps(), { key: `news-off:${user.id}`, to: { id: user.id, email: user.email }, template: 'new-draft', category: 'trial-news', content: { subject: 'x', text: 'x', html: 'x' } });
    expect(row).toMatchObject({ status: 'skipped', lastError: 'Not sent: the recipient turned off news about your trials (decisions, new drafts).' });
    await flushOutbox(deps(), later(new Date(), 5));
    expect(h.capture.to(user.email)).toEqual([]);
    expect((await row!.reload()).status).toBe('skipped');
  });
});

describe('opt-out links', () => {
  it('a forged or damaged link changes nothing and says so', async () => {
    const user = await createUser('forged');
    const res = await request(h.t.app).get('/api/mail/opt-out/not-a-real-token');
    expect(res.status).toBe(400);
    expect(res.text).toContain('This link does not work');
    const post = await request(h.t.app).post('/api/mail/opt-out/not-a-real-token');
    expect(post.status).toBe(400);
    expect(post.body.error.fields).toEqual({ token: 'is not valid' });
    expect((await User.findByPk(user.id))!.mailReminders).toBe(true);
  });

  it('opening the link changes nothing: it asks, and only the button (POST) stops the mail', async () => {
    const user = await createUser('scanned');
    const url = new URL(optOutUrl(h.t.config, user.id, 'reminders'));
    // A mail scanner opens the link: a page that asks, and no change.
    const opened = await request(h.t.app).get(url.pathname);
    expect(opened.status).toBe(200);
    expect(opened.headers['cache-control']).toBe('no-store');
    expect(opened.text).toContain('<h1 style="font-size:20px">Stop reminders about due dates?</h1>');
    expect(opened.text).toContain(`<form method="post" action="${url.pathname}">`);
    expect(opened.text).toContain('<input type="hidden" name="confirm" value="stop">');
    expect((await User.findByPk(user.id))!.mailReminders).toBe(true);
    await request(h.t.app).get(url.pathname).expect(200);
    expect((await User.findByPk(user.id))!.mailReminders).toBe(true);

    // The person presses the button.
    const stopped = await request(h.t.app).post(url.pathname).type('form').send({ confirm: 'stop' });
    expect(stopped.status).toBe(200);
    expect(stopped.headers['content-type']).toMatch(/text\/html/);
    expect(stopped.text).toContain('Done: no more of this mail');
    expect((await User.findByPk(user.id))!.mailReminders).toBe(false);
    // Opened again, the page says it is already off.
    expect((await request(h.t.app).get(url.pathname)).text).toContain('This mail is already off');
  });

  it('a mail program’s one-click POST (List-Unsubscribe=One-Click, RFC 8058) stops the mail without a page', async () => {
    const user = await createUser('one-click');
    const url = new URL(optOutUrl(h.t.config, user.id, 'trial-news'));
    const res = await request(h.t.app).post(url.pathname).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ turnedOff: 'trial-news' });
    expect((await User.findByPk(user.id))!.mailTrialNews).toBe(false);
    // A damaged link pressed on the page answers with a page, and changes nothing.
    const bad = await request(h.t.app).post('/api/mail/opt-out/damaged').type('form').send({ confirm: 'stop' });
    expect(bad.status).toBe(400);
    expect(bad.text).toContain('This link does not work');
  });

  it('a session token is not an opt-out link, and an opt-out link is not a session', async () => {
    const user = await createUser('tokens');
    const session = bearer(user, h.t.config).slice('Bearer '.length);
    expect((await request(h.t.app).get(`/api/mail/opt-out/${session}`)).status).toBe(400);
    const token = optOutUrl(h.t.config, user.id, 'digest').split('/').pop()!;
    expect((await request(h.t.app).get('/api/auth/session').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    // RFC 8058 one-click POST works like the GET.
    const post = await request(h.t.app).post(`/api/mail/opt-out/${token}`);
    expect(post.body).toEqual({ turnedOff: 'digest' });
    expect((await User.findByPk(user.id))!.mailDigest).toBe(false);
  });
});
