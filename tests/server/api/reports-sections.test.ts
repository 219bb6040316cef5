import Papa from 'papaparse';
import request from 'supertest';
import { Draft, Pattern, PatternSize, PatternVariant, Report, Trial, type User } from '../../../db/models';
import { bearer, createStudioWorld, createUser, type StudioWorld, enrolTester } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4;
const YD = 914.4;

describe('report sections: what was sewn, fabric used, and the staff filters by draft and variant', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let sizes: PatternSize[];
  let testerA: Awaited<ReturnType<typeof tester>> | undefined;
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });
  const list = (query: string) => request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports${query}`).set(as(w.users.coordinator));

  async function tester(i: number, size: PatternSize) {
    const user = await createUser(`sections-${i}`);
    const { enrollment } = await enrolTester(trial.id, user.id, size.id);
    // Staff see submitted reports only: `submitted()` marks this one as sent.
    const submitted = () => Report.update({ submittedAt: new Date() }, { where: { enrollmentId: enrollment.id } });
    return { user, url: `/api/me/enrollments/${enrollment.id}/reports/final`, submitted };
  }

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Harbour trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    sizes = await Promise.all(['10', '12'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: (39 + position) * IN } })));
    await PatternVariant.create({ patternId: pattern.id, name: 'Fuller belly', kind: 'fuller-belly', position: 0 });
    await Draft.create({ patternId: pattern.id, version: 1, changeNote: 'First draft' });
    await Draft.create({ patternId: pattern.id, version: 2, changeNote: 'Rise lengthened' });
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `sections-${Date.now()}`, title: 'Harbour trousers', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 2 })), heightBands: [], variants: [] } });
  });
  afterAll(() => t.close());

  it('offers the chart sizes, the variants and the drafts, and keeps the fabric used with its checks', async () => {
    const a = await tester(1, sizes[0]);
    testerA = a;
    const empty = await request(t.app).get(a.url).set(as(a.user));
    expect(empty.body.choices).toMatchObject({ sizes: ['10', '12'], chosenSize: '10', variants: ['Fuller belly'], drafts: [{ version: 1 }, { version: 2, changeNote: 'Rise lengthened' }] });

    const fabric = { kind: 'Linen', fibre: '100% linen', widthMm: 54 * IN, usedMm: 2.5 * YD, stretchPct: null, napped: false };
    const saved = await request(t.app).put(a.url).set(as(a.user)).send({ baseVersion: 0, changes: { sizeSewn: '10', variantSewn: 'Fuller belly', draftVersion: 2, fabric } });
    expect(saved.status).toBe(200);
    expect(saved.body.content).toMatchObject({ variantSewn: 'Fuller belly', draftVersion: 2, fabric: { kind: 'Linen', napped: false } });
    expect(saved.body.content.fabric.usedMm).toBeCloseTo(2286, 6); // 2 1/2 yd = 2286 mm (1 yd = 0.9144 m exactly)

    const narrow = await request(t.app).put(a.url).set(as(a.user)).send({ baseVersion: 1, changes: { fabric: { ...fabric, widthMm: 100, usedMm: -1 } } });
    expect(narrow.status).toBe(400);
    expect(narrow.body.error.fields).toMatchObject({ 'changes.fabric.widthMm': expect.stringMatching(/30 cm/), 'changes.fabric.usedMm': expect.stringMatching(/more than zero/) });
    // The bad change lost nothing already saved.
    expect((await request(t.app).get(a.url).set(as(a.user))).body.content.fabric.widthMm).toBeCloseTo(54 * IN, 6);
  });

  it('filters the staff list and the CSV by draft and by variant ("-" is the main pattern)', async () => {
    const a = testerA!;
    const b = await tester(2, sizes[1]);
    await request(t.app).put(b.url).set(as(b.user)).send({ baseVersion: 0, changes: { sizeSewn: '12', variantSewn: null, draftVersion: 1, alterations: [{ area: 'waist', kind: 'other', amountMm: -10, where: 'back', otherText: 'Took in the back waist' }] } }).expect(200);
    await a.submitted();
    await b.submitted();

    const draft2 = await list('?stage=final&draft=2');
    expect(draft2.body.map((r: { size: string }) => r.size)).toEqual(['10']);
    const fuller = await list(`?variant=${encodeURIComponent('Fuller belly')}`);
    expect(fuller.body.map((r: { size: string }) => r.size)).toEqual(['10']);
    const main = await list('?variant=-');
    expect(main.body.map((r: { size: string }) => r.size)).toEqual(['12']);
    const badDraft = await list('?draft=two');
    expect(badDraft.status).toBe(400);
    expect(badDraft.body.error.fields.draft).toMatch(/draft number/);

    await request(t.app).put(`/api/studios/${w.studio.id}/trials/${trial.id}/other-alterations`).set(as(w.users.coordinator)).send({ text: 'took in the back waist', kind: 'waist' }).expect(200);
    const csv = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports.csv?stage=final`).set(as(w.users.grader));
    expect(csv.status).toBe(200);
    const rows = Papa.parse<Record<string, string>>(csv.text, { header: true, skipEmptyLines: true }).data;
    const linen = rows.find((r) => r.size === '10')!;
    expect(linen).toMatchObject({ variant: 'Fuller belly', draft: '2', fabric: 'Linen, 100% linen', one_way: 'false' });
    expect(Number(linen.fabric_used_mm)).toBeCloseTo(2286, 6);
    expect(rows.find((r) => r.size === '12')).toMatchObject({ kind: 'other: Took in the back waist', read_as: 'waist', amount_mm: '-10' });
  });
});
