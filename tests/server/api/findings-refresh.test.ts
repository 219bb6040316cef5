import { Client } from 'pg';
import request from 'supertest';
import { FindingSnapshot, OtherAlterationMapping, Pattern, PatternSize, Report, Trial, type Enrollment, type User } from '../../../db/models';
import { FINDINGS_QUEUE } from '../../../server/findings/findings-jobs';
import { startJobQueue, type JobQueue } from '../../../server/jobs/queue';
import { bearer, createStudioWorld, createUser, enrolTester, type StudioWorld } from '../../support/factories';
import { startMailHarness, type MailHarness } from './mail-support';

const IN = 25.4;

async function until(check: () => Promise<boolean>, ms = 30_000) {
  const end = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 200));
  }
}

/**
 * When the findings are recomputed and what a read loads: a revision kept by the database, a read
 * that leaves the reports alone while the stored findings are current, and submissions that leave
 * the recomputation to a debounced job on the queue. This file has its own database (the job queue's
 * tables and a table lock must not touch other suites).
 */
describe('findings revision, fresh reads and the debounced recomputation job', () => {
  let h: MailHarness;
  let w: StudioWorld;
  let trial: Trial;
  let sizes: PatternSize[];
  let queue: JobQueue | null = null;
  const base = () => `/api/studios/${w.studio.id}/trials/${trial.id}`;
  const as = (user: User) => ({ Authorization: bearer(user, h.t.config) });
  const revision = async () => BigInt((await Trial.findByPk(trial.id))!.findingsRevision);
  const backRise = (body: { result: { findings: { kind: string; direction: string; count: number }[] } }) => body.result.findings.find((f) => f.kind === 'back-rise' && f.direction === 'add');

  async function tester(i: number, size: PatternSize): Promise<{ user: User; enrollment: Enrollment }> {
    const user = await createUser(`refresh-${i}`);
    const { enrollment } = await enrolTester(trial.id, user.id, size.id, { profileSnapshot: { measurementsMm: { hip: size.bodyMm.hip, inseam: 30 * IN } } });
    return { user, enrollment };
  }

  /** Writes a complete final report through the API and submits it; returns the submit answer. */
  async function submitThroughApi(i: number) {
    const { user, enrollment } = await tester(i, sizes[i % 3]);
    const put = await request(h.t.app)
      .put(`/api/me/enrollments/${enrollment.id}/reports/final`)
      .set(as(user))
      .send({ baseVersion: 0, changes: { sizeSewn: sizes[i % 3].label, draftVersion: 1, fit: { rise: -1 }, verdict: 'Short in the back rise.', alterations: [{ area: 'rise', kind: 'back-rise', amountMm: 20, where: 'back', note: '', otherText: '' }] } });
    expect(put.status).toBe(200);
    return request(h.t.app).post(`/api/me/enrollments/${enrollment.id}/reports/final/submit`).set(as(user));
  }

  beforeAll(async () => {
    h = await startMailHarness();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Quay trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip', 'inseam'] });
    sizes = await Promise.all(['8', '10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: (37 + 1.5 * position) * IN, inseam: 30 * IN } })));
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `refresh-${Date.now()}`, title: 'Quay trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 10 })), heightBands: [], variants: [] } });
    for (let i = 0; i < 9; i += 1) {
      const { enrollment } = await tester(i, sizes[i % 3]);
      const alterations = i < 8 ? [{ area: 'rise' as const, kind: 'back-rise', amountMm: 0.75 * IN, where: 'back' as const, note: '', otherText: '' }] : [];
      await Report.create({ enrollmentId: enrollment.id, stage: 'final', submittedAt: new Date(), content: { sizeSewn: sizes[i % 3].label, draftVersion: 1, fit: { rise: -1 }, alterations, verdict: 'Fine apart from the rise.' } });
    }
  });
  afterAll(async () => {
    await queue?.stop();
    await h.close();
  });

  it('the database bumps the revision on a submitted report, a reading of an "other" alteration and the size chart, not on a draft being typed', async () => {
    const start = await revision();
    const { enrollment } = await tester(100, sizes[0]);
    const draft = await Report.create({ enrollmentId: enrollment.id, stage: 'final', content: { draftVersion: 1 } });
    await draft.update({ content: { draftVersion: 1, verdict: 'Still sewing' } });
    expect(await revision()).toBe(start);
    await draft.update({ submittedAt: new Date() });
    expect(await revision()).toBe(start + 1n);
    await OtherAlterationMapping.create({ trialId: trial.id, textKey: 'took in the waist', kind: 'waist' });
    expect(await revision()).toBe(start + 2n);
    await sizes[0].update({ bodyMm: { ...sizes[0].bodyMm, hip: sizes[0].bodyMm.hip + 1 } });
    expect(await revision()).toBe(start + 3n);
    await draft.destroy();
    await OtherAlterationMapping.destroy({ where: { trialId: trial.id } });
    expect(await revision()).toBe(start + 5n);
  });

  it('a read of current findings does not touch the reports: it answers while the reports table is locked', async () => {
    const first = await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(first.status).toBe(200);
    expect(first.body.pending).toBe(false);
    expect(backRise(first.body)?.count).toBe(8);
    const t = (await Trial.findByPk(trial.id))!;
    expect(t.findingsComputedRevision).toBe(t.findingsRevision);

    // Another connection holds an exclusive lock on the reports: anything that reads them waits.
    const locker = new Client({ connectionString: h.databaseUrl });
    await locker.connect();
    await locker.query('BEGIN');
    await locker.query('LOCK TABLE reports IN ACCESS EXCLUSIVE MODE');
    try {
      const timeout = new Promise<'blocked'>((resolve) => setTimeout(() => resolve('blocked'), 3000));
      const fresh = await Promise.race([request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader)), timeout]);
      expect(fresh).not.toBe('blocked');
      expect((fresh as request.Response).status).toBe(200);
      expect(backRise((fresh as request.Response).body)?.count).toBe(8);

      // The same check fails once the stored findings are behind: that read must load the reports.
      await h.t.sequelize.query('UPDATE trials SET findings_revision = findings_revision + 1 WHERE id = $1', { bind: [trial.id] });
      const stale = request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader)).then((r) => r);
      expect(await Promise.race([stale, new Promise<'blocked'>((resolve) => setTimeout(() => resolve('blocked'), 1500))])).toBe('blocked');
      await locker.query('ROLLBACK');
      expect((await stale).status).toBe(200);
    } finally {
      await locker.end();
    }
  });

  it('with the job queue running, a submission answers without recomputing; the read says newer reports are being counted until the job has run', async () => {
    queue = await startJobQueue({ config: h.t.config, mailer: h.t.mailer }, { databaseUrl: h.databaseUrl, schedule: false, log: false });
    const before = (await FindingSnapshot.findOne({ where: { trialId: trial.id, draft: '1' } }))!;
    const submitted = await submitThroughApi(1);
    expect(submitted.status).toBe(200);
    // Nothing was recomputed inside the request: the snapshot is as it was, a job waits for the trial.
    const same = (await FindingSnapshot.findOne({ where: { trialId: trial.id, draft: '1' } }))!;
    expect(same.testers).toBe(before.testers);
    const [jobs] = await h.t.sequelize.query(`SELECT state FROM pgboss.job WHERE name = $1 AND singleton_key = $2`, { bind: [FINDINGS_QUEUE, trial.id] });
    expect(jobs).toEqual([{ state: 'created' }]);

    const pending = await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(pending.status).toBe(200);
    expect(pending.body.pending).toBe(true);
    expect(pending.body.result.testers).toBe(9);
    expect(pending.body.computedAt).toEqual(expect.any(String));

    await until(async () => (await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader))).body.pending === false);
    const done = await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(done.body.result.testers).toBe(10);
    expect(backRise(done.body)?.count).toBe(9);
  });

  it('a burst of submissions to one trial is counted by one or two recomputations, not one each', async () => {
    const [[{ count: completedBefore }]] = (await h.t.sequelize.query(
      `SELECT count(*)::int AS count FROM pgboss.job WHERE name = $1 AND singleton_key = $2 AND state = 'completed'`,
      { bind: [FINDINGS_QUEUE, trial.id] },
    )) as unknown as [[{ count: number }]];
    const answers = await Promise.all([2, 3, 4, 5, 6].map((i) => submitThroughApi(10 + i)));
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
    await until(async () => (await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader))).body.pending === false);
    const done = await request(h.t.app).get(`${base()}/findings`).set(as(w.users.grader));
    expect(done.body.result.testers).toBe(15);
    const [[{ count: completedAfter }]] = (await h.t.sequelize.query(
      `SELECT count(*)::int AS count FROM pgboss.job WHERE name = $1 AND singleton_key = $2 AND state = 'completed'`,
      { bind: [FINDINGS_QUEUE, trial.id] },
    )) as unknown as [[{ count: number }]];
    expect(completedAfter - completedBefore).toBeGreaterThanOrEqual(1);
    expect(completedAfter - completedBefore).toBeLessThanOrEqual(2);
  });
});
