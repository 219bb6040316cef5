import request from 'supertest';
import { OutboxMessage, RewardCode, Trial, User } from '../../../db/models';
import { DEMO_RELEASED_SLUG } from '../../../db/seeders/demo-release';
import { seedDemoStudio } from '../../../db/seeders/demo-studio';
import { bearer } from '../../support/factories';
import { startMailHarness, type MailHarness } from './mail-support';

let h: MailHarness;
let trial: Trial;
const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, h.t.config) });
const user = async (email: string) => (await User.findOne({ where: { email } }))!;

beforeAll(async () => {
  // A database of this file's own: the demo is loaded (twice) without touching other suites.
  h = await startMailHarness();
  await seedDemoStudio(h.t.sequelize, 4);
  await seedDemoStudio(h.t.sequelize, 4);
  trial = (await Trial.findOne({ where: { slug: DEMO_RELEASED_SLUG } }))!;
});
afterAll(() => h.close());

describe('the demo’s released trial and its returning testers', () => {
  it('is released with its checklist holding, its reward codes given and its mail recorded once', async () => {
    const designer = await user('designer@demo.basted.test');
    const base = `/api/studios/${trial.studioId}/trials/${trial.id}`;
    const status = await request(h.t.app).get(`${base}/release`).set(as(designer));
    expect(status.body.released).toMatchObject({ by: 'Demo Designer', openItems: [] });
    expect(status.body.checklist.map((i: { key: string; ok: boolean }) => [i.key, i.ok])).toEqual([
      ['findings-triaged', true],
      ['will-fix-drafted', true],
      ['coverage', true],
      ['testers-done', true],
      ['final-draft', true],
    ]);
    const summary = await request(h.t.app).get(`${base}/summary`).set(as(designer));
    expect(summary.body.coverage).toMatchObject({ target: 22, finished: 20 });
    expect(summary.body.findings.drafts[0].findings).toEqual([expect.objectContaining({ name: 'Bodice length, added', classLabel: 'Whole draft', triageLabel: 'Fixed in draft 2' })]);
    expect(summary.body.drafts.map((d: { version: number; final: boolean }) => [d.version, d.final])).toEqual([[1, false], [2, false], [3, true]]);

    expect(await RewardCode.count({ where: { trialId: trial.id } })).toBe(22);
    expect(await OutboxMessage.count({ where: { trialId: trial.id, template: 'reward-code', status: 'sent' } })).toBe(20);
    expect(await OutboxMessage.count({ where: { trialId: trial.id, template: 'release-thanks', status: 'sent' } })).toBe(20);
    expect(await OutboxMessage.count({ where: { trialId: trial.id, template: 'release-closing', status: 'sent' } })).toBe(2);
    // Asking again sends nothing: the demo's mail sits under the release's own keys.
    const again = await request(h.t.app).post(`${base}/reward-codes/send`).set(as(designer));
    expect(again.body.delivery).toEqual({ assigned: 0, sent: 0, missing: 0 });
    expect(h.capture.messages).toEqual([]);
  });

  it('shows a demo tester their final files and reward code, and the studio a pool of returning testers', async () => {
    const tester = await user('tester1@demo.basted.test');
    const mine = await request(h.t.app).get('/api/me/releases').set(as(tester));
    expect(mine.body).toEqual([expect.objectContaining({ trialTitle: 'Boxy top: fit round (demo)', finished: true, rewardCode: expect.stringMatching(/^TERN-BOXY-\d{3}$/), finalDraft: expect.objectContaining({ version: 3 }) })]);
    const link = await request(h.t.app).post(`/api/me/final-files/${mine.body[0].finalDraft.files[0].id}/link`).set(as(tester));
    expect(link.status).toBe(200);

    const coordinator = await user('coordinator@demo.basted.test');
    const pool = await request(h.t.app).get(`/api/studios/${trial.studioId}/pool`).set(as(coordinator));
    const returning = pool.body.filter((p: { trials: unknown[] }) => p.trials.length === 2);
    expect(returning.length).toBeGreaterThanOrEqual(5);
    expect(returning.every((p: { trials: { title: string }[] }) => p.trials.some((t) => t.title === 'Boxy top: fit round (demo)'))).toBe(true);
  });
});
