import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { Pattern, Trial } from '../../../db/models';
import { bearer, createStudioWorld } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

/** A small export of the web app, compressed by the same script the set-up runs after `expo export`. */
function fakeExport(): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'basted-dist-'));
  mkdirSync(path.join(dir, '_expo/static/js/web'), { recursive: true });
  writeFileSync(path.join(dir, 'index.html'), `<!DOCTYPE html><html><head><title>Basted</title><meta name="description" content="Basted runs fit trials."/></head><body>${'<div>shell</div>'.repeat(200)}</body></html>`);
  writeFileSync(path.join(dir, '_expo/static/js/web/entry-abc.js'), `console.log(${JSON.stringify('bundle '.repeat(2000))});`);
  execFileSync(process.execPath, [path.resolve('scripts/precompress.mjs'), dir]);
  return dir;
}

describe('compressed answers and the public call page', () => {
  let t: TestApp;
  let dist: string;
  beforeAll(() => {
    dist = fakeExport();
    t = buildTestApp({ WEB_DIST: dist, PUBLIC_URL: 'https://basted.test' });
  });
  afterAll(async () => {
    await t.close();
    rmSync(dist, { recursive: true, force: true });
  });

  it('serves the bundle from its Brotli copy, or gzip, or plain, as the browser accepts, with long caching', async () => {
    const br = await request(t.app).get('/_expo/static/js/web/entry-abc.js').set('Accept-Encoding', 'gzip, deflate, br');
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers['cache-control']).toMatch(/immutable/);
    const gz = await request(t.app).get('/_expo/static/js/web/entry-abc.js').set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.text).toContain('bundle bundle');
    const plain = await request(t.app).get('/_expo/static/js/web/entry-abc.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
  });

  it('sends the app shell compressed at any address, and JSON answers of the API compressed', async () => {
    const shell = await request(t.app).get('/trials/anything').set('Accept-Encoding', 'br');
    expect(shell.status).toBe(200);
    expect(shell.headers['content-encoding']).toBe('br');
    expect(shell.headers['content-type']).toMatch(/html/);
    const w = await createStudioWorld();
    // A list of many trials is worth compressing.
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Pattern for a long list', category: 'skirt', fabricKind: 'woven', bodyColumns: ['hip'] });
    for (let i = 0; i < 30; i += 1) await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `long-list-${Date.now()}-${i}`, title: `Trial number ${i} of a long list`, callText: 'Call text '.repeat(20) });
    const list = await request(t.app).get(`/api/studios/${w.studio.id}/trials`).set('Authorization', bearer(w.users.owner, t.config)).set('Accept-Encoding', 'gzip');
    expect(list.status).toBe(200);
    expect(list.headers['content-encoding']).toBe('gzip');
    expect(list.body).toHaveLength(30);
  });

  it("a public call's page carries its own title and sharing preview tags; an unknown call gets the plain shell", async () => {
    const w = await createStudioWorld();
    const pattern = await Pattern.create({ studioId: w.studio.id, name: 'Harbour jacket', category: 'jacket', fabricKind: 'woven', bodyColumns: ['bust'] });
    const trial = await Trial.create({ studioId: w.studio.id, patternId: pattern.id, slug: `harbour-${Date.now()}`, title: 'Harbour jacket <test>', state: 'open', coverage: { sizes: [], heightBands: [], variants: [] } });
    const page = await request(t.app).get(`/call/${trial.slug}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain('<title>Harbour jacket &lt;test&gt; — a fit trial by Studio here | Basted</title>');
    expect(page.text).toContain('<meta property="og:title" content="Harbour jacket &lt;test&gt; — a fit trial by Studio here | Basted"/>');
    expect(page.text).toContain(`<meta property="og:url" content="https://basted.test/call/${trial.slug}"/>`);
    expect(page.text.match(/<title>/g)).toHaveLength(1);
    const unknown = await request(t.app).get('/call/no-such-call');
    expect(unknown.status).toBe(200);
    expect(unknown.text).toContain('<title>Basted</title>');
  });
});
