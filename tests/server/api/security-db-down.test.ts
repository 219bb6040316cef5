import { Client } from 'pg';
import request from 'supertest';
import { bearer, createUser, TEST_PASSWORD } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';
import { ownMailDatabase } from './mail-support';

/**
 * PostgreSQL going away under a running server, played on a database of this file's own: new
 * connections refused and the open ones ended, as during a restart.
 */
describe('while PostgreSQL is down', () => {
  let db: Awaited<ReturnType<typeof ownMailDatabase>>;
  let t: TestApp;
  let previousUrl: string | undefined;
  const admin = async (sql: string) => {
    const c = new Client({ connectionString: process.env.BASTED_ADMIN_DATABASE_URL });
    await c.connect();
    try {
      await c.query(sql);
    } finally {
      await c.end();
    }
  };
  const name = () => new URL(db.url).pathname.slice(1);

  beforeAll(async () => {
    db = await ownMailDatabase();
    previousUrl = process.env.DATABASE_URL;
    process.env.DATABASE_URL = db.url;
    t = buildTestApp();
  });
  afterAll(async () => {
    await admin(`ALTER DATABASE "${name()}" WITH ALLOW_CONNECTIONS true`);
    await t.close();
    process.env.DATABASE_URL = previousUrl;
    await db.drop();
  });

  it('every request answers 503 with Retry-After (never 500), and the server recovers when it is back', async () => {
    const user = await createUser('db-down');
    const auth = { Authorization: bearer(user, t.config) };
    expect((await request(t.app).get('/api/me/profile').set(auth)).status).toBe(200);

    await admin(`ALTER DATABASE "${name()}" WITH ALLOW_CONNECTIONS false`);
    await admin(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = '${name()}'`);
    const calls: [string, () => request.Test][] = [
      ['profile', () => request(t.app).get('/api/me/profile').set(auth)],
      ['profile change', () => request(t.app).patch('/api/me/profile').set(auth).send({ fitNotes: 'long torso' })],
      ['sign-in', () => request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })],
      ['studios', () => request(t.app).get('/api/studios').set(auth)],
      ['public call', () => request(t.app).get('/api/calls/some-call')],
      ['my trials', () => request(t.app).get('/api/me/trials').set(auth)],
    ];
    for (const [what, call] of calls) {
      const res = await call();
      expect([what, res.status]).toEqual([what, 503]);
      expect(res.headers['retry-after']).toBe('30');
      expect(res.body.error.code).toBe('unavailable');
    }
    expect((await request(t.app).get('/api/health')).status).toBe(503);

    await admin(`ALTER DATABASE "${name()}" WITH ALLOW_CONNECTIONS true`);
    expect((await request(t.app).get('/api/me/profile').set(auth)).status).toBe(200);
  });
});
