import { Writable } from 'node:stream';
import type { Request, Response } from 'express';
import request from 'supertest';
import { DatabaseError } from 'sequelize';
import { Draft, Milestone, Pattern, PatternSize, Report, Trial, User } from '../../../db/models';
import { createLogger } from '../../../server/logger';
import { errorHandler } from '../../../server/middleware/error-handler';
import { bearer, createStudioWorld, enrolTester, type StudioWorld } from '../../support/factories';
import { tinyPdf } from '../../support/sample-files';
import { buildTestApp, type TestApp } from '../../support/test-app';

const DAY = 86_400_000;
const NUL = 'before\u0000after';
const LONE = 'half \uD800 a character';

/** A logger whose lines land in an array, to read what the server would have written. */
function capturedLogger() {
  const lines: string[] = [];
  const destination = new Writable({
    write(chunk: Buffer, _enc, done) {
      lines.push(chunk.toString());
      done();
    },
  });
  return { logger: createLogger({ level: 'debug', destination }), lines };
}

describe('hostile values are refused by name, never a 500, and change nothing', () => {
  let t: TestApp;
  let w: StudioWorld;
  let trial: Trial;
  let reportUrl: string;
  const as = (user: User) => ({ Authorization: bearer(user, t.config) });

  beforeAll(async () => {
    t = buildTestApp();
    w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Hostile trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
    const size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
    trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `hostile-${Date.now()}`, title: 'Hostile', state: 'running', coverage: { sizes: [{ sizeId: size.id, target: 2 }], heightBands: [], variants: [] } });
    await Milestone.create({ trialId: trial.id, kind: 'final-report', dueAt: new Date(Date.now() + 5 * DAY) });
    const { enrollment } = await enrolTester(trial.id, w.users.tester.id, size.id);
    reportUrl = `/api/me/enrollments/${enrollment.id}/reports/final`;
    await request(t.app).put(reportUrl).set(as(w.users.tester)).send({ baseVersion: 0, changes: { verdict: 'Saved before', sizeSewn: 'M' } }).expect(200);
  });
  afterAll(() => t.close());

  it('NUL or a lone surrogate in any report text answers 400 naming the field, and the saved report stays as it was', async () => {
    const cases: [object, string][] = [
      [{ verdict: NUL }, 'verdict'],
      [{ verdict: LONE }, 'verdict'],
      [{ alterations: [{ area: 'rise', kind: 'back-rise', amountMm: 10, where: 'back', note: NUL }] }, 'alterations.0.note'],
      [{ alterations: [{ area: 'waist', kind: 'other', amountMm: 10, where: 'back', otherText: LONE }] }, 'alterations.0.otherText'],
      [{ fabric: { kind: NUL, fibre: '', widthMm: null, usedMm: null, stretchPct: null, napped: false } }, 'fabric.kind'],
      [{ unclearSteps: [{ step: '3', problem: LONE }] }, 'unclearSteps.0.problem'],
      [{ sizeSewn: NUL }, 'sizeSewn'],
    ];
    for (const [body, field] of cases) {
      const res = await request(t.app).put(reportUrl).set(as(w.users.tester)).send({ baseVersion: 1, changes: body });
      // Named by its place in the body: the report's changes (the screen reads them without "changes.").
      expect([field, res.status, Object.keys(res.body.error?.fields ?? {})]).toEqual([field, 400, [`changes.${field}`]]);
    }
    const report = await Report.findOne({ where: { enrollmentId: reportUrl.split('/')[4], stage: 'final' } });
    expect(report!.content).toMatchObject({ verdict: 'Saved before', sizeSewn: 'M' });
  });

  it('a NUL in a plain text column is refused, not stored as the two characters "\\0"', async () => {
    const res = await request(t.app).post(`/api/studios/${w.studio.id}/patterns`).set(as(w.users.owner)).send({ name: `Coat${NUL}`, category: 'coat', fabricKind: 'woven' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['name']);
    expect(await Pattern.count({ where: { studioId: w.studio.id, name: 'Coat\\0after' } })).toBe(0);
    // The same through a multipart form (the draft's change note).
    const pattern = await Pattern.findOne({ where: { studioId: w.studio.id } });
    const draft = await request(t.app).post(`/api/studios/${w.studio.id}/patterns/${pattern!.id}/drafts`).set(as(w.users.owner)).field('changeNote', `Rise ${NUL}`).attach('print-a4', tinyPdf(), 'a4.pdf');
    expect(draft.status).toBe(400);
    expect(Object.keys(draft.body.error.fields)).toEqual(['changeNote']);
    expect(await Draft.count({ where: { patternId: pattern!.id } })).toBe(0);
  });

  it('a year-0000 date, a height-band label with NUL and a vanishing length each answer 400 naming the field', async () => {
    const trials = `/api/studios/${w.studio.id}/trials`;
    const zero = await request(t.app).patch(`${trials}/${trial.id}`).set(as(w.users.owner)).send({ milestones: { 'final-report': '0000-01-01T00:00:00Z' } });
    expect(zero.status).toBe(400);
    expect(Object.keys(zero.body.error.fields)).toEqual(['milestones.final-report']);
    const band = await request(t.app)
      .patch(`${trials}/${trial.id}`)
      .set(as(w.users.owner))
      .send({ coverage: { sizes: [], heightBands: [{ id: 'a', label: `Tall${NUL}`, minMm: null, maxMm: null }], variants: [] } });
    expect(band.status).toBe(400);
    expect(Object.keys(band.body.error.fields)).toEqual(['coverage.heightBands.0.label']);
    const pattern = await Pattern.findOne({ where: { studioId: w.studio.id } });
    const tiny = await request(t.app)
      .put(`/api/studios/${w.studio.id}/patterns/${pattern!.id}/chart`)
      .set(as(w.users.owner))
      .send({ draftedHeightMm: 5e-324, bodyColumns: ['hip'], finishedColumns: [], sizes: [{ label: 'M', bodyMm: { hip: 1000 } }], variants: [] });
    expect(tiny.status).toBe(400);
    expect(Object.keys(tiny.body.error.fields)).toEqual(['draftedHeightMm']);
    expect((await Milestone.findOne({ where: { trialId: trial.id, kind: 'final-report' } }))!.dueAt.getUTCFullYear()).toBeGreaterThan(2000);
  });

  it('a key named __proto__, JSON nested past any form, and NUL in the query or the path answer 4xx', async () => {
    const proto = await request(t.app).put(reportUrl).set(as(w.users.tester)).set('Content-Type', 'application/json').send('{"baseVersion":1,"changes":{"fit":{"__proto__":{"polluted":1}}}}');
    expect(proto.status).toBe(400);
    expect(Object.keys(proto.body.error.fields)).toEqual(['changes.fit.__proto__']);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    const deep = await request(t.app).put(reportUrl).set(as(w.users.tester)).set('Content-Type', 'application/json').send(`${'['.repeat(5000)}${']'.repeat(5000)}`);
    expect(deep.status).toBe(400);
    const query = await request(t.app).get(`/api/studios/${w.studio.id}/trials/${trial.id}/reports?variant=%00`).set(as(w.users.grader));
    expect(query.status).toBe(400);
    expect(Object.keys(query.body.error.fields)).toEqual(['variant']);
    const path = await request(t.app).get('/api/calls/%00');
    expect(path.status).toBeGreaterThanOrEqual(400);
    expect(path.status).toBeLessThan(500);
  });
});

describe('logs, health and caching', () => {
  it('the request log keeps no invitation, opt-out, reset or confirmation token, nor cookies and Bearer tokens', async () => {
    const { logger, lines } = capturedLogger();
    const t = buildTestApp({ LOG_REQUESTS: 'true' }, { logger });
    try {
      const secret = 'SeCrEtToKeN0123456789abcdefABCDEF';
      await request(t.app).get(`/api/invitations/${secret}`);
      await request(t.app).get(`/api/mail/opt-out/${secret}`);
      await request(t.app).get(`/reset-password?token=${secret}`);
      await request(t.app).get(`/verify-email?token=${secret}&next=%2Finvitations%2F${secret}`);
      await request(t.app).get(`/invitations/${secret}`);
      await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${secret}`).set('Cookie', `basted_session=${secret}`);
      expect(lines.length).toBeGreaterThanOrEqual(6);
      const all = lines.join('\n');
      expect(all).not.toContain(secret);
      expect(all).toContain('/api/invitations/[redacted]');
      expect(all).toContain('/reset-password?token=[redacted]');
    } finally {
      await t.close();
    }
  });

  it('a 500 is logged without the SQL or its parameters (which can hold a whole report)', () => {
    const { logger, lines } = capturedLogger();
    const original = Object.assign(new Error('deadlock detected'), { code: '40P01', table: 'reports', sql: 'UPDATE reports SET content = $1', parameters: ['{"verdict":"my private words about my body"}'] });
    const failure = new DatabaseError(original as never);
    const res = { statusCode: 200, headers: {} as Record<string, string>, setHeader(k: string, v: string) { this.headers[k] = v; }, status(code: number) { this.statusCode = code; return this; }, json() { return this; } };
    errorHandler(logger)(failure, { method: 'PUT', originalUrl: '/api/me/enrollments/x/reports/final' } as Request, res as unknown as Response, () => undefined);
    expect(res.statusCode).toBe(500);
    const all = lines.join('\n');
    expect(all).toContain('40P01');
    expect(all).not.toContain('my private words');
    expect(all).not.toContain('UPDATE reports');
  });

  it('the health answer names no internal host or port, and personal answers are not cached', async () => {
    const t = buildTestApp({ SMTP_PORT: '9', S3_ENDPOINT: 'http://127.0.0.1:9' });
    try {
      const health = await request(t.app).get('/api/health');
      expect(health.status).toBe(503);
      // Timings ("ms":9) aside, no address or port of the parts behind it.
      expect(JSON.stringify(health.body).replace(/"ms":\d+/g, '')).not.toMatch(/127\.0\.0\.1|:9\b|ECONNREFUSED|localhost/);
      expect(health.body.mail).toMatchObject({ ok: false, error: 'not answering' });
      const w = await createStudioWorld();
      const profile = await request(t.app).get('/api/me/profile').set({ Authorization: bearer(w.users.tester, t.config) });
      expect(profile.status).toBe(200);
      expect(profile.headers['cache-control']).toBe('no-store');
    } finally {
      await t.close();
    }
  });
});
