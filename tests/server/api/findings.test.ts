import request from 'supertest';
import { Pattern, PatternSize, Report, Trial } from '../../../db/models';
import { bearer, createStudioWorld, createUser, type StudioWorld, enrolTester } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;

describe('findings from the stored final reports', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Sailor trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip', 'inseam'] });
    const sizes = await Promise.all(
      ['8', '10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: (37 + 1.5 * position) * IN, inseam: 30 * IN } })),
    );
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `findings-${Date.now()}`, title: 'Sailor trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 4 })), heightBands: [], variants: [] } });
    // Twelve testers, four per size. Planted: every tester lengthens the back crotch by about 3/4 in
    // (a draft-wide problem); one tester shortens the leg.
    for (let i = 0; i < 12; i += 1) {
      const size = sizes[i % 3];
      const user = await createUser(`finder-${i}`);
      const { enrollment: e } = await enrolTester(trial.id, user.id, size.id, { profileSnapshot: { measurementsMm: { hip: size.bodyMm.hip, inseam: (30 - (i === 0 ? 2 : 0)) * IN } }, plannedFabric: 'Twill' });
      type Alteration = { area: 'rise' | 'leg'; kind: string; amountMm: number; where: 'back' | 'both'; note: string; otherText: string };
      const alterations: Alteration[] = [{ area: 'rise', kind: 'back-rise', amountMm: (0.75 + (i % 4) * 0.05) * IN, where: 'back', note: '', otherText: '' }];
      if (i === 0) alterations.push({ area: 'leg', kind: 'leg-length', amountMm: -2 * IN, where: 'both', note: '', otherText: '' });
      await Report.create({ enrollmentId: e.id, stage: 'final', submittedAt: new Date(), content: { sizeSewn: size.label, draftVersion: 1, fit: { rise: -1 }, alterations, verdict: 'Rise short at the back.' } });
    }
  });
  afterAll(() => t.close());

  it('classifies a back-rise change made by every tester as draft-wide, with reasons, for the grader', async () => {
    const res = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/findings`).set({ Authorization: bearer(w.users.grader, t.config) });
    expect(res.status).toBe(200);
    expect(res.body.input.testers).toBe(12);
    const rise = res.body.result.findings.find((f: { kind: string; direction: string }) => f.kind === 'back-rise' && f.direction === 'add');
    expect(rise).toMatchObject({ class: 'draft-wide', testers: 12, count: 12 });
    expect(rise.reasons.join(' ')).toMatch(/12 of 12 testers/);
    const leg = res.body.result.findings.find((f: { kind: string }) => f.kind === 'leg-length');
    expect(leg.count).toBe(1);
    expect(leg.class).not.toBe('draft-wide');
  });

  it('names a draft without reports, and is closed to testers', async () => {
    const bad = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/findings?draft=7`).set({ Authorization: bearer(w.users.grader, t.config) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.draft).toMatch(/draft "7" has no reports/);
    const tester = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/findings`).set({ Authorization: bearer(w.users.tester, t.config) });
    expect(tester.status).toBe(403);
  });
});
