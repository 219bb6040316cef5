import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { Invitation, OutboxMessage, Studio } from '../../../db/models';
import { bearer, createStudioWorld, createUser, TEST_PASSWORD, uniqueEmail } from '../../support/factories';
import { buildTestApp } from '../../support/test-app';

/** A client address of its own (IPv6 documentation range), as a proxy reports it. */
const client = () => ({ 'X-Forwarded-For': `2001:db8::${randomUUID().slice(0, 4)}:${randomUUID().slice(0, 4)}` });

describe('rate limits shared by every instance, behind a trusted proxy', () => {
  it('behind the proxy each client counts on its own, and successful sign-ins do not count at all', async () => {
    const t = buildTestApp({ AUTH_RATE_LIMIT: '3' });
    try {
      const user = await createUser('behind-proxy');
      // Twelve people signing in through the same proxy, all from the same office address.
      const office = client();
      for (let i = 0; i < 12; i += 1) {
        expect((await request(t.app).post('/api/auth/sign-in').set(office).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(200);
      }
      const guesser = client();
      for (let i = 0; i < 3; i += 1) await request(t.app).post('/api/auth/sign-in').set(guesser).send({ email: user.email, password: 'a wrong guess' });
      expect((await request(t.app).post('/api/auth/sign-in').set(guesser).send({ email: user.email, password: 'a wrong guess' })).status).toBe(429);
      // The guesser's lock is theirs alone.
      expect((await request(t.app).post('/api/auth/sign-in').set(office).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(200);
    } finally {
      await t.close();
    }
  });

  it('with TRUST_PROXY=false a forwarded address is not believed (every client is the proxy)', async () => {
    const t = buildTestApp({ AUTH_RATE_LIMIT: '2', TRUST_PROXY: 'false' });
    // This test's own limiter name cannot be used, so the loopback counter is cleared first.
    await t.sequelize.query("DELETE FROM rate_limits WHERE key LIKE 'sign-in:%127.0.0.1'");
    try {
      const user = await createUser('untrusted');
      const statuses: number[] = [];
      for (let i = 0; i < 3; i += 1) {
        statuses.push((await request(t.app).post('/api/auth/sign-in').set(client()).send({ email: user.email, password: 'a wrong guess' })).status);
      }
      expect(statuses).toEqual([401, 401, 429]);
    } finally {
      await t.sequelize.query("DELETE FROM rate_limits WHERE key LIKE 'sign-in:%127.0.0.1'");
      await t.close();
    }
  });

  it('two instances count together: failures on one are counted on the other, in the shared table', async () => {
    const a = buildTestApp({ AUTH_RATE_LIMIT: '4' });
    const b = buildTestApp({ AUTH_RATE_LIMIT: '4' });
    try {
      const user = await createUser('two-instances');
      const who = client();
      for (const app of [a.app, b.app, a.app, b.app]) {
        expect((await request(app).post('/api/auth/sign-in').set(who).send({ email: user.email, password: 'a wrong guess' })).status).toBe(401);
      }
      expect((await request(a.app).post('/api/auth/sign-in').set(who).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(429);
      expect((await request(b.app).post('/api/auth/sign-in').set(who).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(429);
      const [rows] = await a.sequelize.query('SELECT key, points FROM rate_limits WHERE key = :key', { replacements: { key: `sign-in:${who['X-Forwarded-For']}` } });
      expect(rows).toEqual([{ key: `sign-in:${who['X-Forwarded-For']}`, points: expect.any(Number) }]);
    } finally {
      await a.close();
      await b.close();
    }
  });

  it('sign-up requests are limited per client address and per target address', async () => {
    const t = buildTestApp({ SIGN_UP_RATE_LIMIT: '2' });
    try {
      const who = client();
      const statuses: number[] = [];
      for (let i = 0; i < 3; i += 1) {
        statuses.push((await request(t.app).post('/api/auth/sign-up').set(who).send({ name: 'Many', email: uniqueEmail('many'), password: 'a long enough pass' })).status);
      }
      expect(statuses).toEqual([202, 202, 429]);
      // One address cannot be sent more than five confirmation e-mails an hour, whoever asks.
      const target = uniqueEmail('target');
      const perTarget: number[] = [];
      for (let i = 0; i < 6; i += 1) perTarget.push((await request(t.app).post('/api/auth/sign-up').set(client()).send({ name: 'Flood', email: target, password: 'a long enough pass' })).status);
      expect(perTarget).toEqual([202, 202, 202, 202, 202, 429]);
    } finally {
      await t.close();
    }
  });
});

describe('invitations cannot relay spam', () => {
  it('a studio sends at most INVITATION_DAILY_LIMIT invitations a day; refused ones do not count; other studios are not affected', async () => {
    const t = buildTestApp({ INVITATION_DAILY_LIMIT: '3' });
    try {
      const w = await createStudioWorld();
      const owner = { Authorization: bearer(w.users.owner, t.config) };
      const invite = (studioId: string, email: string, who = owner) => request(t.app).post(`/api/studios/${studioId}/invitations`).set(who).send({ email, role: 'tester' });
      expect((await invite(w.studio.id, 'not an address')).status).toBe(400);
      const statuses: number[] = [];
      for (let i = 0; i < 4; i += 1) statuses.push((await invite(w.studio.id, uniqueEmail('spam'))).status);
      expect(statuses).toEqual([201, 201, 201, 429]);
      const refused = await invite(w.studio.id, uniqueEmail('spam'));
      expect(refused.body.error.message).toMatch(/this studio today.*wait \d+ (minutes|hours)/);
      expect(await Invitation.count({ where: { studioId: w.studio.id } })).toBe(3);
      expect((await invite(w.otherStudio.id, uniqueEmail('elsewhere'), { Authorization: bearer(w.users.otherOwner, t.config) })).status).toBe(201);
    } finally {
      await t.close();
    }
  });

  it('a studio or person name may not carry a web or e-mail address into the invitation e-mail', async () => {
    const t = buildTestApp();
    try {
      const user = await createUser('namer');
      const as = { Authorization: bearer(user, t.config) };
      for (const name of ['Your account is locked – verify at evil.example.test', 'Verify now: https://x.test/a', 'Write to help@x.test', 'go to www.something']) {
        const res = await request(t.app).post('/api/studios').set(as).send({ name });
        expect([name, res.status, Object.keys(res.body.error?.fields ?? {})]).toEqual([name, 400, ['name']]);
      }
      expect(await Studio.count({ where: { name: 'Verify now: https://x.test/a' } })).toBe(0);
      const profile = await request(t.app).patch('/api/me/profile').set(as).send({ name: 'Verify at bit.example.test/x' });
      expect(profile.status).toBe(400);
      expect(profile.body.error.fields.name).toMatch(/web or e-mail address/);
      // Ordinary names pass.
      expect((await request(t.app).post('/api/studios').set(as).send({ name: 'St. Ives Sewing & Co' })).status).toBe(201);
    } finally {
      await t.close();
    }
  });

  it('an account whose address was never confirmed cannot send invitations', async () => {
    const t = buildTestApp();
    try {
      const w = await createStudioWorld();
      await w.users.owner.update({ emailVerifiedAt: null });
      const email = uniqueEmail('never-sent');
      const res = await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set({ Authorization: bearer(w.users.owner, t.config) }).send({ email, role: 'grader' });
      expect(res.status).toBe(403);
      expect(await OutboxMessage.count({ where: { recipientEmail: email } })).toBe(0);
    } finally {
      await t.close();
    }
  });
});
