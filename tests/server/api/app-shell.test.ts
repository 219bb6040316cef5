import path from 'node:path';
import { mkdtemp, mkdir, writeFile } from 'node:fs/promises';
import os from 'node:os';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../../support/test-app';

describe('the Express app around the API', () => {
  let t: TestApp;
  let dist: string;

  beforeAll(async () => {
    // A stand-in export, so these tests do not depend on a web build.
    dist = await mkdtemp(path.join(os.tmpdir(), 'basted-dist-'));
    await mkdir(path.join(dist, '_expo/static/js/web'), { recursive: true });
    await writeFile(path.join(dist, 'index.html'), '<!doctype html><title>Basted</title><div id="root"></div>');
    await writeFile(path.join(dist, '_expo/static/js/web/entry-abc.js'), 'console.log(1)');
    t = buildTestApp({ WEB_DIST: dist });
  });
  afterAll(() => t.close());

  it('when an API route does not exist, answers 404 in the error shape', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.stringContaining('/api/no-such-thing') } });
  });

  it('when the JSON body is malformed, answers 400 in the error shape, not 500', async () => {
    const res = await request(t.app).post('/api/health').set('content-type', 'application/json').send('{"a":');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'entity_parse_failed', message: expect.any(String) });
  });

  it('when the body is larger than the limit, answers 413 in the error shape', async () => {
    const res = await request(t.app)
      .post('/api/health')
      .set('content-type', 'application/json')
      .send(JSON.stringify({ text: 'x'.repeat(1_100_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('entity_too_large');
  });

  it('serves a deep link of the web app with the SPA fallback, uncached', async () => {
    const res = await request(t.app).get('/call/summer-trousers');
    expect(res.status).toBe(200);
    expect(res.text).toContain('<div id="root">');
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('serves hashed bundles with long immutable caching', async () => {
    const res = await request(t.app).get('/_expo/static/js/web/entry-abc.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toContain('immutable');
  });

  it('sends the security headers of helmet', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('when the web app was never exported, says how to build it instead of failing', async () => {
    const bare = buildTestApp({ WEB_DIST: path.join(dist, 'missing') });
    try {
      const res = await request(bare.app).get('/trials');
      expect(res.status).toBe(503);
      expect(res.text).toContain('npm start');
    } finally {
      await bare.close();
    }
  });
});
