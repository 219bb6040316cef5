import request from 'supertest';
import { PatternSize } from '../../../db/models';
import { bearer, createStudioWorld, type StudioWorld } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4; // mm per inch, exact (1959 international yard and pound agreement)

describe('patterns and size charts', () => {
  let t: TestApp;
  let w: StudioWorld;
  let base: string;
  const as = (who: keyof StudioWorld['users']) => ({ Authorization: bearer(w.users[who], t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    base = `/api/studios/${w.studio.id}/patterns`;
  });
  afterAll(() => t.close());

  async function newPattern(body: object = {}) {
    const res = await request(t.app)
      .post(base)
      .set(as('coordinator'))
      .send({ name: 'Wide-leg trousers', category: 'trousers', fabricKind: 'woven', ...body });
    expect(res.status).toBe(201);
    return res.body as { id: string };
  }

  const chart = {
    draftedHeightMm: 1676, // 5 ft 6 in
    bodyColumns: ['waist', 'hip', 'inseam'],
    finishedColumns: ['hip', 'thigh'],
    sizes: [
      { label: '10', bodyMm: { waist: 28 * IN, hip: 38 * IN, inseam: 30 * IN }, finishedMm: { hip: 40.5 * IN } },
      { label: '12', bodyMm: { waist: 29.5 * IN, hip: 39.5 * IN, inseam: 30 * IN }, finishedMm: { hip: 42 * IN } },
      { label: '14', bodyMm: { waist: 31 * IN, hip: 41 * IN, inseam: 30 * IN }, finishedMm: { hip: 43.5 * IN } },
    ],
    variants: [{ name: 'Fuller belly front', kind: 'fuller-belly', columns: ['waist'], valuesMm: { '12': { waist: 31 * IN } } }],
  };

  it('creates a pattern; a knit must give its minimum stretch, named in the error', async () => {
    const knit = await request(t.app).post(base).set(as('owner')).send({ name: 'Tee', category: 'top', fabricKind: 'knit' });
    expect(knit.status).toBe(400);
    expect(knit.body.error.fields).toEqual({ minStretchPct: 'A knit pattern needs its minimum stretch in %' });
    const ok = await request(t.app).post(base).set(as('owner')).send({ name: 'Tee', category: 'top', fabricKind: 'knit', minStretchPct: 40 });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ name: 'Tee', fabricKind: 'knit', minStretchPct: 40, archived: false });
    const bad = await request(t.app).post(base).set(as('owner')).send({ name: '', category: 'cape', fabricKind: 'felt' });
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['category', 'fabricKind', 'name']);
  });

  it('keeps the “made for children” flag: false unless given, changed by PATCH, refused when not true or false', async () => {
    const plain = await newPattern({ name: 'Hoodie', category: 'top' });
    expect((await request(t.app).get(`${base}/${plain.id}`).set(as('grader'))).body.childrensWear).toBe(false);
    const kids = await request(t.app).post(base).set(as('coordinator')).send({ name: 'Kids hoodie', category: 'jacket', fabricKind: 'woven', childrensWear: true });
    expect(kids.status).toBe(201);
    expect(kids.body.childrensWear).toBe(true);
    const changed = await request(t.app).patch(`${base}/${plain.id}`).set(as('coordinator')).send({ childrensWear: true });
    expect(changed.status).toBe(200);
    expect(changed.body.childrensWear).toBe(true);
    const listed = await request(t.app).get(base).set(as('grader'));
    expect(listed.body.find((x: { id: string }) => x.id === plain.id).childrensWear).toBe(true);
    const bad = await request(t.app).patch(`${base}/${plain.id}`).set(as('coordinator')).send({ childrensWear: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ childrensWear: 'must be true or false' });
  });

  it('a change that leaves fields out keeps them: archiving keeps the notes, a knit’s stretch and the children’s flag', async () => {
    const p = await request(t.app)
      .post(base)
      .set(as('coordinator'))
      .send({ name: 'Kids tee', category: 'top', fabricKind: 'knit', minStretchPct: 40, notes: 'Fit notes kept', childrensWear: true });
    expect(p.status).toBe(201);
    const archived = await request(t.app).patch(`${base}/${p.body.id}`).set(as('owner')).send({ archived: true });
    expect(archived.status).toBe(200);
    expect(archived.body).toMatchObject({ archived: true, minStretchPct: 40, notes: 'Fit notes kept', childrensWear: true });
  });

  it('archives a pattern out of the list and back', async () => {
    const p = await newPattern({ name: 'Archived skirt', category: 'skirt' });
    await request(t.app).patch(`${base}/${p.id}`).set(as('owner')).send({ archived: true }).expect(200);
    const listed = await request(t.app).get(base).set(as('grader'));
    expect(listed.body.map((x: { id: string }) => x.id)).not.toContain(p.id);
    const all = await request(t.app).get(`${base}?archived=true`).set(as('grader'));
    expect(all.body.find((x: { id: string }) => x.id === p.id).archived).toBe(true);
  });

  it('saves a chart with variants, and keeps each size’s identity across a rename and a reorder', async () => {
    const p = await newPattern();
    const saved = await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart);
    expect(saved.status).toBe(200);
    const sizes = saved.body.chart.sizes as { id: string; label: string; bodyMm: Record<string, number> }[];
    expect(sizes.map((s) => s.label)).toEqual(['10', '12', '14']);
    expect(sizes[1].bodyMm.hip).toBeCloseTo(39.5 * IN, 9);
    const variant = saved.body.chart.variants[0];
    expect(variant.valuesMm[sizes[1].id].waist).toBeCloseTo(31 * IN, 9);

    // Rename 10 → 8 and move 14 first; the ids follow the sizes.
    const next = {
      ...chart,
      sizes: [
        { ...chart.sizes[2], id: sizes[2].id },
        { ...chart.sizes[0], id: sizes[0].id, label: '8' },
        { ...chart.sizes[1], id: sizes[1].id },
      ],
      variants: [{ ...chart.variants[0], id: variant.id, valuesMm: { [sizes[1].id]: { waist: 31.5 * IN } } }],
    };
    const moved = await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(next);
    expect(moved.status).toBe(200);
    expect(moved.body.chart.sizes.map((s: { id: string; label: string }) => `${s.label}:${s.id}`)).toEqual([
      `14:${sizes[2].id}`,
      `8:${sizes[0].id}`,
      `12:${sizes[1].id}`,
    ]);
    expect(moved.body.chart.variants[0].id).toBe(variant.id);
  });

  it('refuses a bad chart naming the size and column, and keeps the saved one', async () => {
    const p = await newPattern();
    await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const bad = {
      ...chart,
      sizes: [
        { label: '10', bodyMm: { hip: 30 } }, // 3 cm: inches typed as centimetres, or worse
        { label: '10', bodyMm: { bust: 900 } },
      ],
    };
    const res = await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(bad);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      'sizes.0.bodyMm.hip': expect.stringMatching(/outside the plausible range/),
      'sizes.1.label': 'Size "10" appears twice',
      'sizes.1.bodyMm.bust': 'is not one of the chart’s columns',
    });
    expect(await PatternSize.count({ where: { patternId: p.id } })).toBe(3);
  });

  it('exports the chart as CSV in the caller’s unit and imports it back unchanged', async () => {
    const p = await newPattern();
    await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const csv = await request(t.app).get(`${base}/${p.id}/chart.csv`).set(as('grader'));
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\r\n')[0]).toBe('Size,Waist (in),Hip (in),Inseam (in),Finished hip (in),Finished thigh (in)');
    expect(csv.text.split('\r\n')[1]).toBe('10,28,38,30,40.5,');

    const edited = csv.text.replace('12,29.5,39.5,30,42,', '12,29 1/2,100.3 cm,30,42,');
    const back = await request(t.app).post(`${base}/${p.id}/chart.csv`).set(as('coordinator')).set('Content-Type', 'text/csv').send(edited);
    expect(back.status).toBe(200);
    const size12 = back.body.chart.sizes.find((s: { label: string }) => s.label === '12');
    expect(size12.bodyMm.waist).toBeCloseTo(29.5 * IN, 6);
    expect(size12.bodyMm.hip).toBeCloseTo(1003, 6);
    // The variant of size 12 survives because size 12 is still in the file.
    expect(back.body.chart.variants[0].valuesMm[size12.id].waist).toBeCloseTo(31 * IN, 6);
  });

  it('refuses a CSV with a bad row, naming row and column, and saves nothing of it', async () => {
    const p = await newPattern();
    await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const file = ['Size,Waist (in),Hip (in),Wingspan (in)', '10,28,38,60', '12,twenty-nine,39 1/2,61', ',30,41,62'].join('\n');
    const res = await request(t.app).post(`${base}/${p.id}/chart.csv`).set(as('coordinator')).set('Content-Type', 'text/csv').send(file);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_csv');
    expect(res.body.error.fields).toMatchObject({
      'row 1, column Wingspan (in)': expect.stringMatching(/not a measurement Basted knows/),
      'row 3, column Waist (in)': expect.stringMatching(/could not be read/),
      'row 4, column Size': 'the size label is empty',
    });
    const after = await request(t.app).get(`${base}/${p.id}`).set(as('grader'));
    expect(after.body.chart.sizes.map((s: { label: string }) => s.label)).toEqual(['10', '12', '14']);
    expect(after.body.chart.bodyColumns).toEqual(['waist', 'hip', 'inseam']);
  });

  it('a CSV whose values are implausible is refused by row and column too', async () => {
    const p = await newPattern();
    const file = ['Size,Hip (cm)', '10,96', '12,9.9'].join('\n');
    const res = await request(t.app).post(`${base}/${p.id}/chart.csv`).set(as('coordinator')).set('Content-Type', 'text/csv').send(file);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['row 3, column hip']).toMatch(/outside the plausible range/);
  });

  it('saves fabric needs per size, width and layout; an unknown size is named and nothing changes', async () => {
    const p = await newPattern();
    await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const needs = [
      { size: '10', widthMm: 1143, napped: false, lengthMm: 2.25 * 914.4 },
      { size: '10', widthMm: 1143, napped: true, lengthMm: 2.75 * 914.4 },
      { size: '12', widthMm: 1524, napped: false, lengthMm: 1.875 * 914.4 },
    ];
    const ok = await request(t.app).put(`${base}/${p.id}/fabric-needs`).set(as('coordinator')).send({ needs });
    expect(ok.status).toBe(200);
    expect(ok.body.fabricNeeds).toHaveLength(3);
    const bad = await request(t.app)
      .put(`${base}/${p.id}/fabric-needs`)
      .set(as('coordinator'))
      .send({ needs: [...needs, { size: '44', widthMm: 1143, napped: false, lengthMm: 2000 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ 'needs.3.size': '"44" is not a size of this pattern' });
    expect((await request(t.app).get(`${base}/${p.id}`).set(as('grader'))).body.fabricNeeds).toHaveLength(3);
  });

  it('refuses a one-way (napped) need below the plain need for the same size and width, naming the cell; nothing changes', async () => {
    const p = await newPattern();
    const saved = await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const size10 = saved.body.chart.sizes.find((s: { label: string }) => s.label === '10').id as string;
    const first = [
      { size: '10', widthMm: 1143, napped: false, lengthMm: 2.5 * 914.4 },
      { size: '10', widthMm: 1143, napped: true, lengthMm: 2.75 * 914.4 },
    ];
    await request(t.app).put(`${base}/${p.id}/fabric-needs`).set(as('coordinator')).send({ needs: first }).expect(200);

    // The size named once by label and once by id is still the same size. 2 1/4 yd < 2 1/2 yd.
    const bad = await request(t.app)
      .put(`${base}/${p.id}/fabric-needs`)
      .set(as('coordinator'))
      .send({
        needs: [
          { size: '10', widthMm: 1143, napped: false, lengthMm: 2.5 * 914.4 },
          { size: '12', widthMm: 1143, napped: false, lengthMm: 2000 },
          { size: size10, widthMm: 1143, napped: true, lengthMm: 2.25 * 914.4 },
        ],
      });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['needs.2.lengthMm']);
    // Worded in the caller's units (the coordinator reads inches and yards).
    expect(bad.body.error.fields['needs.2.lengthMm']).toMatch(/^Size 10, 45 in wide, one way: 2 1\/4 yd is less than the 2 1\/2 yd stated without a one-way layout/);
    const after = (await request(t.app).get(`${base}/${p.id}`).set(as('grader'))).body.fabricNeeds as { napped: boolean; lengthMm: number }[];
    expect(after.find((n) => n.napped)?.lengthMm).toBeCloseTo(2.75 * 914.4, 6);

    // Two lengths that round up to the same eighth (2290 and 2300 mm are both 2 5/8 yd) show the millimetres.
    const close = await request(t.app)
      .put(`${base}/${p.id}/fabric-needs`)
      .set(as('coordinator'))
      .send({ needs: [{ size: '10', widthMm: 1143, napped: false, lengthMm: 2300 }, { size: '10', widthMm: 1143, napped: true, lengthMm: 2290 }] });
    expect(close.status).toBe(400);
    expect(close.body.error.fields['needs.1.lengthMm']).toContain('2 5/8 yd (2290 mm) is less than the 2 5/8 yd (2300 mm)');
  });

  it('accepts a one-way need equal to the plain one, and one-way needs at a width with no plain need', async () => {
    const p = await newPattern();
    await request(t.app).put(`${base}/${p.id}/chart`).set(as('coordinator')).send(chart).expect(200);
    const ok = await request(t.app)
      .put(`${base}/${p.id}/fabric-needs`)
      .set(as('coordinator'))
      .send({
        needs: [
          { size: '10', widthMm: 1143, napped: false, lengthMm: 2300 },
          { size: '10', widthMm: 1143, napped: true, lengthMm: 2300 },
          // a one-way need at 60 in below the plain need at 45 in is fine: a wider fabric takes less
          { size: '10', widthMm: 1524, napped: true, lengthMm: 1800 },
        ],
      });
    expect(ok.status).toBe(200);
    expect(ok.body.fabricNeeds).toHaveLength(3);
  });

  it('a pattern of another studio is not found, even by id', async () => {
    const p = await newPattern();
    const other = await request(t.app)
      .get(`/api/studios/${w.otherStudio.id}/patterns/${p.id}`)
      .set({ Authorization: bearer(w.users.otherOwner, t.config) });
    expect(other.status).toBe(404);
  });
});
