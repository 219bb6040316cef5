import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { Pattern, PatternSize, Report, Trial, type User } from '../../../db/models';
import { bearer, createStudioWorld, createUser, enrolTester, type StudioWorld } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

/** Follows `Link: rel="next"` from a first page to the end; returns every page's rows. */
async function allPages(t: TestApp, first: string, headers: Record<string, string>) {
  const pages: { id: string }[][] = [];
  let next: string | null = first;
  while (next) {
    const res: request.Response = await request(t.app).get(next).set(headers);
    expect(res.status).toBe(200);
    pages.push(res.body);
    next = /<([^>]+)>; rel="next"/.exec(res.headers.link ?? '')?.[1] ?? null;
    if (next) expect(res.headers['x-next-cursor']).toEqual(expect.any(String));
  }
  return pages;
}

describe('the trial page reads: pages, indexes, health', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  const base = () => `/api/studios/${w.studio.id}/trials/${trial.id}`;
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Pier skirt', category: 'skirt', fabricKind: 'woven', bodyColumns: ['hip'] });
    const sizes = await Promise.all(['8', '10'].map((label, position) => PatternSize.create({ patternId: pattern.id, label, position, bodyMm: { hip: 950 + 50 * position } })));
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `pages-${Date.now()}`, title: 'Pier skirt', state: 'running', coverage: { sizes: sizes.map((s) => ({ sizeId: s.id, target: 10 })), heightBands: [], variants: [] } });
    for (let i = 0; i < 5; i += 1) {
      const user = await createUser(`pages-${i}`);
      const { enrollment } = await enrolTester(trial.id, user.id, sizes[i % 2].id);
      await Report.create({ enrollmentId: enrollment.id, stage: 'check-in', submittedAt: new Date(), content: { draftVersion: 1, alterations: [] } });
      // Sent final reports (staff lists show sent reports only).
      if (i % 2 === 0) await Report.create({ enrollmentId: enrollment.id, stage: 'final', submittedAt: new Date(), content: { draftVersion: 1, alterations: [] } });
    }
  });
  afterAll(() => t.close());

  it.each(['applications', 'enrollments', 'reports'])('%s come a page at a time; following the next links gives every row once, in the order of the whole list', async (list) => {
    const whole = await request(t.app).get(`${base()}/${list}`).set(as(w.users.coordinator));
    expect(whole.status).toBe(200);
    expect(whole.headers.link).toBeUndefined();
    const pages = await allPages(t, `${base()}/${list}?limit=2`, as(w.users.coordinator));
    expect(pages.length).toBe(Math.ceil(whole.body.length / 2));
    expect(pages.every((p) => p.length <= 2)).toBe(true);
    expect(pages.flat().map((r) => r.id)).toEqual(whole.body.map((r: { id: string }) => r.id));
  });

  it('the reports filters hold across pages', async () => {
    const pages = await allPages(t, `${base()}/reports?stage=final&limit=1`, as(w.users.coordinator));
    expect(pages.flat()).toHaveLength(3);
    expect(pages.flat().every((r) => (r as unknown as { stage: string }).stage === 'final')).toBe(true);
  });

  it('a damaged cursor or a bad limit is a 400 naming it, never a 500', async () => {
    const cursor = await request(t.app).get(`${base()}/applications?cursor=not-a-cursor`).set(as(w.users.coordinator));
    expect(cursor.status).toBe(400);
    expect(cursor.body.error.fields.cursor).toMatch(/cursor/);
    const limit = await request(t.app).get(`${base()}/enrollments?limit=0`).set(as(w.users.coordinator));
    expect(limit.status).toBe(400);
    expect(limit.body.error.fields.limit).toEqual(expect.any(String));
    const tooMany = await request(t.app).get(`${base()}/reports?limit=100000`).set(as(w.users.coordinator));
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.fields.limit).toMatch(/at most/);
  });

  it('the page queries can use the indexes made for them (EXPLAIN with sequential scans off)', async () => {
    const plan = async (sql: string) =>
      t.sequelize.transaction(async (transaction) => {
        await t.sequelize.query('SET LOCAL enable_seqscan = off', { transaction });
        const rows = await t.sequelize.query<{ 'QUERY PLAN': string }>(`EXPLAIN ${sql}`, { bind: [trial.id], type: QueryTypes.SELECT, transaction });
        return rows.map((r) => r['QUERY PLAN']).join('\n');
      });
    expect(await plan('SELECT id FROM applications WHERE trial_id = $1 ORDER BY applied_at, id LIMIT 3')).toMatch(/applications_trial_page/);
    expect(await plan('SELECT id FROM enrollments WHERE trial_id = $1 ORDER BY created_at, id LIMIT 3')).toMatch(/enrollments_trial_page/);
    expect(await plan(`SELECT id FROM enrollments WHERE user_id = $1`)).toMatch(/enrollments_user/);
    expect(await plan(`SELECT id FROM applications WHERE user_id = $1`)).toMatch(/applications_user/);
  });

  it('liveness answers without asking the database, the file store or the mail server', async () => {
    const dead = buildTestApp({ SMTP_PORT: '9', S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const live = await request(dead.app).get('/api/health/live');
      expect(live.status).toBe(200);
      expect(live.body).toEqual({ status: 'ok' });
      expect((await request(dead.app).get('/api/health')).status).toBe(503);
    } finally {
      await dead.close();
    }
  });

  it('the deep health check is asked of the services once per few seconds, however many callers', async () => {
    const fresh = buildTestApp();
    try {
      const mailCheck = jest.spyOn(fresh.mailer, 'check');
      const storageCheck = jest.spyOn(fresh.storage, 'check');
      const answers = await Promise.all([1, 2, 3, 4].map(() => request(fresh.app).get('/api/health')));
      const again = await request(fresh.app).get('/api/health');
      expect([...answers, again].map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
      expect(mailCheck).toHaveBeenCalledTimes(1);
      expect(storageCheck).toHaveBeenCalledTimes(1);
      expect(again.body.checkedAt).toBe(answers[0].body.checkedAt);
    } finally {
      await fresh.close();
    }
  });
});
