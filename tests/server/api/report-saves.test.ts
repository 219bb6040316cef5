import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { Enrollment, Milestone, Pattern, PatternSize, Report, Trial, type User } from '../../../db/models';
import { analysisInputFor } from '../../../server/findings/findings.service';
import { bearer, createStudioWorld, createUser, enrolTester, type StudioWorld } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;
const DAY = 86_400_000;
const COMPLETE = { sizeSewn: 'M', draftVersion: 1, fit: { waist: 0 }, verdict: 'Fits well after a small change.' };

describe('saving and submitting a report: versions, one transaction, nothing invented', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let size: PatternSize;
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Canal trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `saves-${Date.now()}`, title: 'Canal trousers', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 80 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'toile-check-in', dueAt: new Date(Date.now() + 3 * DAY) });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 10 * DAY) });
  });
  afterAll(() => t.close());

  async function tester(prefix: string) {
    const user = await createUser(prefix);
    const { enrollment } = await enrolTester(trial.id, user.id, size.id);
    const url = (stage: 'check-in' | 'final') => `/api/me/enrollments/${enrollment.id}/reports/${stage}`;
    const save = (stage: 'check-in' | 'final', baseVersion: number, changes: object) => request(t.app).put(url(stage)).set(as(user)).send({ baseVersion, changes });
    const submit = (stage: 'check-in' | 'final', body: object = {}) => request(t.app).post(`${url(stage)}/submit`).set(as(user)).send(body);
    return { user, enrollment, url, save, submit };
  }

  it('a save made on an older version is refused with 409 and the current report; sent again on top of it, both edits are kept', async () => {
    const a = await tester('versions');
    expect((await request(t.app).get(a.url('check-in')).set(as(a.user))).body.version).toBe(0);
    const first = await a.save('check-in', 0, { verdict: 'Typed in the first window.' });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(1);

    // A second window still on version 0.
    const stale = await a.save('check-in', 0, { sizeSewn: 'M' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_report');
    expect(stale.body.report).toMatchObject({ version: 1, content: { verdict: 'Typed in the first window.' } });
    // Nothing of the stale save was stored.
    expect((await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'check-in' } }))!.content.sizeSewn).toBeUndefined();

    const again = await a.save('check-in', stale.body.report.version, { sizeSewn: 'M' });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ version: 2, content: { verdict: 'Typed in the first window.', sizeSewn: 'M' } });
  });

  it('saves racing on one version: exactly one is applied, the others get 409, none is a 500 (also when the report does not exist yet)', async () => {
    const a = await tester('race');
    const racing = await Promise.all(Array.from({ length: 8 }, (_, i) => a.save('check-in', 0, { verdict: `window ${i} wrote this` })));
    const statuses = racing.map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409, 409, 409, 409, 409, 409, 409]);
    const winner = racing.find((r) => r.status === 200)!;
    const row = (await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'check-in' } }))!;
    expect(row.version).toBe(1);
    expect(row.content.verdict).toBe(winner.body.content.verdict);
    for (const lost of racing.filter((r) => r.status === 409)) expect(lost.body.report.content.verdict).toBe(winner.body.content.verdict);
  });

  it('a save without its version is refused naming the field', async () => {
    const a = await tester('no-version');
    const res = await request(t.app).put(a.url('check-in')).set(as(a.user)).send({ changes: { sizeSewn: 'M' } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['baseVersion']);
  });

  it('an alteration row starts with no answers; it is kept but not counted until kind and amount are given, and submitting asks for them', async () => {
    const a = await tester('rows');
    // Only a note: the row is stored as typed, with nothing filled in.
    const saved = await a.save('final', 0, { ...COMPLETE, alterations: [{ note: 'Will measure the leg tonight' }, {}] });
    expect(saved.status).toBe(200);
    expect(saved.body.content.alterations).toEqual([
      { area: null, kind: null, amountMm: null, where: null, note: 'Will measure the leg tonight', otherText: '' },
      { area: null, kind: null, amountMm: null, where: null, note: '', otherText: '' },
    ]);
    const refused = await a.submit('final', { version: 1 });
    expect(refused.status).toBe(400);
    // The row with a note needs its answers; the blank row asks nothing and counts for nothing.
    expect(refused.body.error.fields).toEqual({ 'alterations.0.kind': 'Choose what you changed', 'alterations.0.amountMm': 'Give the amount you changed' });
    expect((await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'final' } }))!.submittedAt).toBeNull();

    const answered = await a.save('final', 1, { alterations: [{ area: 'leg', kind: 'leg-length', amountMm: -1.5 * IN, where: 'both', note: 'Will measure the leg tonight' }, {}] });
    expect(answered.status).toBe(200);
    expect((await a.submit('final', { version: 2 })).status).toBe(200);
    const input = await analysisInputFor(trial);
    const mine = input.reports.filter((r) => r.tester === a.enrollment.id);
    expect(mine).toHaveLength(1);
    // One alteration counts: the answered one, with exactly the typed amount (−1 1/2 in).
    expect(mine[0].alterations).toEqual([{ kind: 'leg-length', amountMm: -1.5 * IN }]);
  });

  it('submit only takes the version the tester saw: a report saved elsewhere meanwhile is not submitted, and the answer says what was stored', async () => {
    const a = await tester('submit-version');
    await a.save('check-in', 0, COMPLETE).expect(200);
    await a.save('check-in', 1, { verdict: 'Changed on the phone meanwhile.' }).expect(200);
    const stale = await a.submit('check-in', { version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.report).toMatchObject({ version: 2, submittedAt: null, content: { verdict: 'Changed on the phone meanwhile.' } });
    expect((await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'check-in' } }))!.submittedAt).toBeNull();

    const done = await a.submit('check-in', { version: 2 });
    expect(done.status).toBe(200);
    const row = (await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'check-in' } }))!;
    expect(done.body).toMatchObject({ version: row.version, submittedAt: row.submittedAt!.toISOString(), content: row.content });
  });

  it('a submission that fails half-way changes nothing; the retry then stores all of it, and a further retry changes nothing', async () => {
    const a = await tester('half-way');
    await a.save('final', 0, COMPLETE).expect(200);
    // The database refuses to finish this enrolment: the failure comes after the report row
    // was already marked submitted inside the transaction.
    await t.sequelize.query(`CREATE OR REPLACE FUNCTION test_refuse_finish() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RAISE EXCEPTION 'refused for the test'; END $$`);
    await t.sequelize.query(`CREATE TRIGGER test_refuse_finish BEFORE UPDATE ON enrollments FOR EACH ROW WHEN (NEW.id = '${a.enrollment.id}' AND NEW.status = 'finished') EXECUTE FUNCTION test_refuse_finish()`);
    const error = jest.spyOn(console, 'error').mockImplementation(() => undefined);
    try {
      const failed = await a.submit('final', { version: 1 });
      expect(failed.status).toBe(500);
    } finally {
      error.mockRestore();
      await t.sequelize.query('DROP TRIGGER test_refuse_finish ON enrollments');
      await t.sequelize.query('DROP FUNCTION test_refuse_finish()');
    }
    expect((await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'final' } }))!.submittedAt).toBeNull();
    expect((await Enrollment.findByPk(a.enrollment.id))!.status).toBe('active');

    const retry = await a.submit('final', { version: 1 });
    expect(retry.status).toBe(200);
    expect((await Enrollment.findByPk(a.enrollment.id))!.status).toBe('finished');
    const again = await a.submit('final', { version: 1 });
    expect(again.status).toBe(200);
    expect(again.body.submittedAt).toBe(retry.body.submittedAt);
  });

  it('a burst of submissions, each sent twice at once, ends with every report submitted once and every enrolment finished', async () => {
    const testers = await Promise.all(Array.from({ length: 12 }, (_, i) => tester(`burst-${i}`)));
    for (const x of testers) await x.save('final', 0, COMPLETE).expect(200);
    const answers = await Promise.all(testers.map((x) => Promise.all([x.submit('final', { version: 1 }), x.submit('final', { version: 1 })])));
    expect(answers.flat().map((r) => r.status).filter((s) => s !== 200)).toEqual([]);
    // Both answers of each tester name the one submission time that was stored.
    for (const [i, pair] of answers.entries()) {
      const row = (await Report.findOne({ where: { enrollmentId: testers[i].enrollment.id, stage: 'final' } }))!;
      expect(pair.map((r) => r.body.submittedAt)).toEqual([row.submittedAt!.toISOString(), row.submittedAt!.toISOString()]);
    }
    const enrolments = await Enrollment.findAll({ where: { id: testers.map((x) => x.enrollment.id) } });
    expect(enrolments.map((e) => e.status)).toEqual(testers.map(() => 'finished'));
  });

  it('a save that lands after a submission read the report and before it wrote: the submission is judged again on the report as it now is', async () => {
    const a = await tester('between');
    await a.save('final', 0, COMPLETE).expect(200);
    // Hold the enrolment as a withdrawal or a save elsewhere would, so the submission waits at its write.
    const held = await t.sequelize.transaction();
    let submitted: Promise<request.Response> | null = null;
    let blocked = false;
    try {
      await t.sequelize.query('SELECT id FROM enrollments WHERE id = $1 FOR UPDATE', { bind: [a.enrollment.id], transaction: held });
      submitted = a.submit('final').then((r) => r);
      // Wait until the submission is blocked on the lock (it has read version 1, complete).
      for (let i = 0; i < 100; i += 1) {
        const [waiting] = await t.sequelize.query<{ n: string }>(
          `SELECT count(*) AS n FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock' AND query LIKE '%FOR UPDATE%'`,
          { type: QueryTypes.SELECT },
        );
        blocked = Number(waiting.n) > 0;
        if (blocked) break;
        await new Promise((r) => setTimeout(r, 50));
      }
      expect(blocked).toBe(true);
      // Meanwhile the verdict is cleared (version 2): the report is no longer complete.
      await t.sequelize.query(`UPDATE reports SET content = content - 'verdict', version = version + 1 WHERE enrollment_id = $1 AND stage = 'final'`, { bind: [a.enrollment.id], transaction: held });
      await held.commit();
    } catch (error) {
      await held.rollback();
      throw error;
    }
    const res = await submitted!;
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('verdict');
    const row = (await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'final' } }))!;
    expect(row.submittedAt).toBeNull();
    expect((await Enrollment.findByPk(a.enrollment.id))!.status).toBe('active');
  });

  it('a tester who left the trial cannot submit', async () => {
    const a = await tester('left');
    await a.save('final', 0, COMPLETE).expect(200);
    await a.enrollment.update({ status: 'dropped' });
    const res = await a.submit('final');
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/left this trial/);
  });

  it('the final report starts from the check-in (size, variant, draft, fit) and says so; every value stays editable', async () => {
    const a = await tester('prefill');
    await a.save('check-in', 0, { sizeSewn: 'M', variantSewn: null, draftVersion: 1, fit: { waist: -1, leg: 1 }, verdict: 'Toile fits.', alterations: [{ area: 'leg', kind: 'leg-length', amountMm: -25.4, where: 'both' }] }).expect(200);
    const opened = await request(t.app).get(a.url('final')).set(as(a.user));
    expect(opened.body).toMatchObject({ version: 0, prefilledFrom: 'check-in', prefilled: ['sizeSewn', 'variantSewn', 'draftVersion', 'fit'] });
    // Only what was sewn and how it fitted is carried over: not the verdict, not the alterations.
    expect(opened.body.content).toEqual({ sizeSewn: 'M', variantSewn: null, draftVersion: 1, fit: { waist: -1, leg: 1 } });

    const changed = await a.save('final', 0, { fit: { waist: 0, leg: 1 }, verdict: 'The finished pair fits.' });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ prefilledFrom: 'check-in', content: { sizeSewn: 'M', draftVersion: 1, fit: { waist: 0, leg: 1 }, verdict: 'The finished pair fits.' } });
    const row = (await Report.findOne({ where: { enrollmentId: a.enrollment.id, stage: 'final' } }))!;
    expect(row.prefilled).toEqual(['sizeSewn', 'variantSewn', 'draftVersion', 'fit']);

    // Without a check-in the final report starts empty.
    const b = await tester('no-check-in');
    const empty = await request(t.app).get(b.url('final')).set(as(b.user));
    expect(empty.body).toMatchObject({ content: {}, prefilledFrom: null, prefilled: [] });
  });
});
