import request from 'supertest';
import { Enrollment, Milestone, Pattern, PatternSize, Report, Trial } from '../../../db/models';
import { bearer, createStudioWorld, type StudioWorld, enrolTester } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;
const DAY = 86_400_000;

describe('check-in and final reports', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let sizeM: PatternSize;
  const as = (user: Parameters<typeof bearer>[0]) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Jogger trousers', category: 'trousers', fabricKind: 'knit', minStretchPct: 30, bodyColumns: ['hip'] });
    sizeM = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `reports-${Date.now()}`, title: 'Joggers', state: 'running', coverage: { sizes: [{ sizeId: sizeM.id, target: 3 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'toile-check-in', dueAt: new Date(Date.now() + 3 * DAY) });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 10 * DAY) });
  });
  afterAll(() => t.close());

  async function enrol(userId: string) {
    return (await enrolTester(trial.id, userId, sizeM.id, { plannedFabric: 'French terry' })).enrollment;
  }

  it('saves as the tester goes: each part sent replaces that part and keeps the rest; bad parts are named and change nothing', async () => {
    const e = await enrol(w.users.tester.id);
    const url = `/api/me/enrollments/${e.id}/reports/check-in`;
    await request(t.app).put(url).set(as(w.users.tester)).send({ baseVersion: 0, changes: { sizeSewn: 'M', fit: { waist: -1, rise: 1 } } }).expect(200);
    const saved = await request(t.app)
      .put(url)
      .set(as(w.users.tester))
      .send({ baseVersion: 1, changes: { alterations: [{ area: 'leg', kind: 'leg-length', amountMm: -1.5 * IN, where: 'both' }] } });
    expect(saved.status).toBe(200);
    expect(saved.body.content).toMatchObject({ sizeSewn: 'M', fit: { waist: -1, rise: 1 }, alterations: [{ kind: 'leg-length' }] });
    expect(saved.body.content.alterations[0].amountMm).toBeCloseTo(-1.5 * IN, 9); // 1 1/2 in shorter, in mm

    const bad = await request(t.app)
      .put(url)
      .set(as(w.users.tester))
      .send({ baseVersion: 2, changes: { alterations: [{ area: 'bust', kind: 'bust', amountMm: 12.7, where: 'front' }, { area: 'leg', kind: 'leg-length', amountMm: 0, where: 'both' }] } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['changes.alterations.1.amountMm']);
    const wrongGarment = await request(t.app).put(url).set(as(w.users.tester)).send({ baseVersion: 2, changes: { alterations: [{ area: 'bust', kind: 'bust', amountMm: 12.7, where: 'front' }] } });
    expect(wrongGarment.status).toBe(400);
    expect(wrongGarment.body.error.fields).toEqual({ 'alterations.0.kind': 'is not an alteration of this garment' });
    // What was saved before is still there (a reload shows it).
    const reread = await request(t.app).get(url).set(as(w.users.tester));
    expect(reread.body.content.alterations).toHaveLength(1);
    expect(reread.body.version).toBe(2);
    expect(reread.body.editable).toBe(true);
  });

  it('submitting needs the required parts, records the time once, and a second submission changes nothing', async () => {
    const e = await enrol(w.users.grader.id);
    const url = `/api/me/enrollments/${e.id}/reports/final`;
    const early = await request(t.app).post(`${url}/submit`).set(as(w.users.grader));
    expect(early.status).toBe(400);
    expect(Object.keys(early.body.error.fields).sort()).toEqual(['draftVersion', 'fit', 'sizeSewn', 'verdict']);
    await request(t.app).put(url).set(as(w.users.grader)).send({ baseVersion: 0, changes: { sizeSewn: 'M', draftVersion: 1, fit: { waist: 0 }, verdict: 'Comfortable; the rise is a touch short.' } }).expect(200);
    const first = await request(t.app).post(`${url}/submit`).set(as(w.users.grader));
    expect(first.status).toBe(200);
    expect(first.body.submittedAt).toEqual(expect.any(String));
    const second = await request(t.app).post(`${url}/submit`).set(as(w.users.grader));
    expect(second.body.submittedAt).toBe(first.body.submittedAt);
    expect((await Enrollment.findByPk(e.id))!.status).toBe('finished');
  });

  it('after the due time the report is closed; more time for this tester opens it again', async () => {
    const e = await enrol(w.users.coordinator.id);
    await e.update({ dueOverrides: { 'toile-check-in': new Date(Date.now() - 1000).toISOString() } });
    const url = `/api/me/enrollments/${e.id}/reports/check-in`;
    const late = await request(t.app).put(url).set(as(w.users.coordinator)).send({ baseVersion: 0, changes: { sizeSewn: 'M' } });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/was due on .*Ask the studio for more time/);
    await e.update({ dueOverrides: { 'toile-check-in': new Date(Date.now() + DAY).toISOString() } });
    expect((await request(t.app).put(url).set(as(w.users.coordinator)).send({ baseVersion: 0, changes: { sizeSewn: 'M' } })).status).toBe(200);
  });

  it('another tester’s report is not found; the staff see reports filtered and export them as CSV', async () => {
    const e = await enrol(w.users.owner.id);
    await request(t.app)
      .put(`/api/me/enrollments/${e.id}/reports/final`)
      .set(as(w.users.owner))
      .send({ baseVersion: 0, changes: { sizeSewn: 'M', draftVersion: 2, fit: { rise: -2 }, alterations: [{ area: 'rise', kind: 'back-rise', amountMm: 19.05, where: 'back' }], verdict: 'Back rise too short.' } })
      .expect(200);
    expect((await request(t.app).get(`/api/me/enrollments/${e.id}/reports/final`).set(as(w.users.tester))).status).toBe(403);
    // Staff see submitted reports only.
    await Report.update({ submittedAt: new Date() }, { where: { enrollmentId: e.id } });

    const base = `/api/studios/${w.studio.id}/trials/${trial.id}`;
    const finals = await request(t.app).get(`${base}/reports?stage=final&draft=2`).set(as(w.users.grader));
    expect(finals.status).toBe(200);
    expect(finals.body.map((r: { tester: string }) => r.tester)).toEqual([w.users.owner.name]);
    const csv = await request(t.app).get(`${base}/reports.csv?stage=final`).set(as(w.users.grader));
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe('tester,size,size_sewn,variant,stage,draft,submitted,on_time,fabric,fabric_width_mm,fabric_used_mm,stretch_pct,one_way,area,kind,read_as,amount_mm,where,note');
    expect(lines.some((l) => l.includes('back-rise,,19.05,back'))).toBe(true);
    const bad = await request(t.app).get(`${base}/reports?stage=middle`).set(as(w.users.grader));
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['stage']);
  });
});
