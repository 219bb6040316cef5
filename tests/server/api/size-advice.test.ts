import request from 'supertest';
import { bearer, createStudioWorld, type StudioWorld } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

const IN = 25.4; // mm per inch, exact (1959 international yard and pound agreement)

describe('size advice through the API', () => {
  let t: TestApp;
  let w: StudioWorld;
  let topId: string;
  let trousersId: string;
  const as = (who: keyof StudioWorld['users']) => ({ Authorization: bearer(w.users[who], t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const base = `/api/studios/${w.studio.id}/patterns`;
    // Bust rows of ASTM D5585-11e1, Table 1 (sizes 8–14), as given in the project's trade reference.
    const top = await request(t.app).post(base).set(as('owner')).send({ name: 'Shell top', category: 'top', fabricKind: 'woven' });
    topId = top.body.id;
    await request(t.app)
      .put(`${base}/${topId}/chart`)
      .set(as('owner'))
      .send({
        draftedHeightMm: null,
        bodyColumns: ['bust'],
        finishedColumns: [],
        sizes: [
          { label: '8', bodyMm: { bust: 36.25 * IN } },
          { label: '10', bodyMm: { bust: 37.25 * IN } },
          { label: '12', bodyMm: { bust: 38.75 * IN } },
          { label: '14', bodyMm: { bust: 40.375 * IN } },
        ],
        variants: [],
      })
      .expect(200);
    const trousers = await request(t.app).post(base).set(as('owner')).send({ name: 'Straight trousers', category: 'trousers', fabricKind: 'woven' });
    trousersId = trousers.body.id;
    await request(t.app)
      .put(`${base}/${trousersId}/chart`)
      .set(as('owner'))
      .send({
        draftedHeightMm: 66 * IN,
        bodyColumns: ['waist', 'hip'],
        finishedColumns: [],
        sizes: [
          { label: '10', bodyMm: { waist: 28 * IN, hip: 38 * IN } },
          { label: '12', bodyMm: { waist: 29.5 * IN, hip: 39.5 * IN } },
          { label: '14', bodyMm: { waist: 31 * IN, hip: 41 * IN } },
        ],
        variants: [{ name: 'Fuller belly front', kind: 'fuller-belly', columns: ['waist'], valuesMm: { '12': { waist: 31.5 * IN } } }],
      })
      .expect(200);
  });
  afterAll(() => t.close());

  it('a tester gets advice from their own saved measurements, with reasons in their unit', async () => {
    await request(t.app)
      .patch('/api/me/profile')
      .set(as('tester'))
      .send({ lengthUnit: 'in', measurementsMm: { bust: 38.75 * IN } })
      .expect(200);
    const res = await request(t.app).get(`/api/studios/${w.studio.id}/patterns/${topId}/size-advice`).set(as('tester'));
    expect(res.status).toBe(200);
    // D5585-11e1 size 12 has a bust of 38 3/4 in.
    expect(res.body.advice.size.label).toBe('12');
    expect(res.body.advice.governedBy).toBe('bust');
    expect(res.body.advice.reasons.join(' ')).toMatch(/38 3\/4 in/);
  });

  it('trouser advice: a waist beyond the size’s by more than the studio margin suggests the fuller-belly front, and a shorter tester shortens the leg', async () => {
    // Hip 39.5 in → size 12; waist 31.5 in is 2 in over size 12's 29.5 in (> the 1 in default margin);
    // 3.5 in shorter than the drafted 5 ft 6 in: shorten the leg (common practice).
    const res = await request(t.app)
      .post(`/api/studios/${w.studio.id}/patterns/${trousersId}/size-advice`)
      .set(as('grader'))
      .send({ measurementsMm: { hip: 39.5 * IN, waist: 31.5 * IN, height: 62.5 * IN } });
    expect(res.status).toBe(200);
    const advice = res.body.advice;
    expect(advice.size.label).toBe('12');
    expect(advice.variantSuggestions.map((v: { kind: string; variantName: string }) => [v.kind, v.variantName])).toContainEqual([
      'fuller-belly',
      'Fuller belly front',
    ]);
    expect(advice.legLength).toMatchObject({ direction: 'shorten', basis: 'height', rough: true });
  });

  it('a tester may not try arbitrary measurements, and an unknown measurement is named', async () => {
    const asTester = await request(t.app)
      .post(`/api/studios/${w.studio.id}/patterns/${trousersId}/size-advice`)
      .set(as('tester'))
      .send({ measurementsMm: { hip: 1000 } });
    expect(asTester.status).toBe(403);
    const bad = await request(t.app)
      .post(`/api/studios/${w.studio.id}/patterns/${trousersId}/size-advice`)
      .set(as('owner'))
      .send({ measurementsMm: { wingspan: 1000 } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)[0]).toMatch(/^measurementsMm/);
  });
});
