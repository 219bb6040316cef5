import { randomUUID } from 'node:crypto';
import jwt from 'jsonwebtoken';
import request from 'supertest';
import { User } from '../../../db/models';
import { SESSION_COOKIE } from '../../../server/auth/session-token';
import { buildTestApp, type TestApp } from '../../support/test-app';
import { createUser, TEST_PASSWORD, uniqueEmail } from '../../support/factories';
import { firstLink, messagesTo, waitForMessage } from '../../support/inbox';

function sessionCookie(res: request.Response): string {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const cookie = cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!cookie) throw new Error('no session cookie set');
  return cookie;
}

describe('accounts: sign-up, sign-in, sign-out', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('signs up through the link in the confirmation e-mail: a hashed password and an httpOnly SameSite session cookie', async () => {
    const email = uniqueEmail('new');
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Nia Sample', email, password: 'a long enough pass' });
    expect(res.status).toBe(202);
    expect(res.headers['set-cookie']).toBeUndefined();
    const mail = await waitForMessage(email, 'Confirm your e-mail address');
    const token = new URL(firstLink(mail.text, '/verify-email')).searchParams.get('token')!;
    // No account before the link is used.
    expect(await User.count({ where: { email } })).toBe(0);

    const done = await request(t.app).post('/api/auth/verify-email').send({ token });
    expect(done.status).toBe(201);
    expect(done.body.user).toMatchObject({ email, name: 'Nia Sample', lengthUnit: 'in' });
    expect(done.body.user.passwordHash).toBeUndefined();
    expect(done.body.token).toBeUndefined();
    const cookie = sessionCookie(done);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);

    const stored = await User.scope('withPassword').findOne({ where: { email } });
    expect(stored!.passwordHash).toMatch(/^\$2[aby]\$04\$/); // bcrypt, at the test cost
    expect(stored!.passwordHash).not.toContain('a long enough pass');
    expect(stored!.emailVerifiedAt).toBeInstanceOf(Date);

    const session = await request(t.app).get('/api/auth/session').set('Cookie', cookie.split(';')[0]);
    expect(session.status).toBe(200);
    expect(session.body).toMatchObject({ user: { email }, studios: [], currentStudioId: null });
    // The link works once.
    expect((await request(t.app).post('/api/auth/verify-email').send({ token })).status).toBe(400);
  });

  it('when the e-mail is taken (in any letter case), answers as for a new address and tells the owner instead', async () => {
    const user = await createUser('taken');
    const fresh = await request(t.app).post('/api/auth/sign-up').send({ name: 'Other', email: uniqueEmail('fresh'), password: 'a long enough pass' });
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Other', email: user.email.toUpperCase(), password: 'a long enough pass' });
    expect(res.status).toBe(fresh.status);
    expect(res.body.message.replace(user.email.toUpperCase(), 'X')).toBe(fresh.body.message.replace(/\S+@example\.test/, 'X'));
    const mail = await waitForMessage(user.email, 'You already have a Basted account');
    expect(mail.text).toContain('Nothing was changed');
  });

  it('when fields are bad, answers 400 naming each of them', async () => {
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: '', email: 'not-an-address', password: 'short' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'name', 'password']);
    expect(res.body.error.fields.password).toMatch(/at least 10/);
  });

  it('signs in by cookie or by Bearer token, and refuses a wrong password without saying which part was wrong', async () => {
    const user = await createUser('signin');
    const ok = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(ok.status).toBe(200);
    // The token is in the httpOnly cookie only; an API client sends the cookie's value back.
    expect(ok.body.token).toBeUndefined();
    const token = sessionCookie(ok).split(';')[0].split('=')[1];

    const viaBearer = await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${token}`);
    expect(viaBearer.status).toBe(200);
    expect(viaBearer.body.user.id).toBe(user.id);

    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: 'not the password' });
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: uniqueEmail('nobody'), password: 'whatever it is' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it('signing out clears the cookie; without a session the session route answers 401', async () => {
    const out = await request(t.app).post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect(sessionCookie(out)).toMatch(/Expires=Thu, 01 Jan 1970/);
    const res = await request(t.app).get('/api/auth/session');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('refuses an expired, forged or garbled token as no session at all', async () => {
    const user = await createUser('tokens');
    const expired = jwt.sign({ ver: 0, sid: randomUUID(), iat: Math.floor(Date.now() / 1000) - 100 }, t.config.auth.jwtSecret, {
      subject: user.id,
      expiresIn: -10,
    });
    const forged = jwt.sign({ ver: 0, sid: randomUUID() }, 'another secret that is long enough!!', { subject: user.id, expiresIn: '1d' });
    for (const token of [expired, forged, 'garbage']) {
      const res = await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${token}`);
      expect(res.status).toBe(401);
    }
  });

  it('renews a cookie session that is more than a day old', async () => {
    const user = await createUser('renew');
    const dayAndAHourAgo = Math.floor(Date.now() / 1000) - 25 * 3600;
    const sid = randomUUID();
    const old = jwt.sign({ ver: 0, sid, iat: dayAndAHourAgo }, t.config.auth.jwtSecret, { subject: user.id, expiresIn: '14d' });
    const res = await request(t.app).get('/api/auth/session').set('Cookie', `${SESSION_COOKIE}=${old}`);
    expect(res.status).toBe(200);
    const renewed = sessionCookie(res).split(';')[0].split('=')[1];
    expect((jwt.decode(renewed) as { iat: number }).iat).toBeGreaterThan(dayAndAHourAgo + 24 * 3600);
    // The same session, renewed: signing out later ends it.
    expect((jwt.decode(renewed) as { sid: string }).sid).toBe(sid);
  });
});

describe('password reset by e-mail', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('mails a single-use link; the new password works, the old one and older sessions do not', async () => {
    const user = await createUser('reset');
    const signedIn = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    const before = { body: { token: sessionCookie(signedIn).split(';')[0].split('=')[1] } };

    const asked = await request(t.app).post('/api/auth/password-reset').send({ email: user.email });
    expect(asked.status).toBe(202);
    const mail = await waitForMessage(user.email, 'Reset your Basted password');
    const link = firstLink(mail.text, '/reset-password');
    const token = new URL(link).searchParams.get('token')!;

    const done = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'a brand new password' });
    expect(done.status).toBe(200);

    const again = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'yet another password' });
    expect(again.status).toBe(400);
    expect(again.body.error.fields.token).toMatch(/expired or was used/);

    expect((await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(401);
    expect(
      (await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: 'a brand new password' })).status,
    ).toBe(200);
    // The session from before the reset has ended.
    expect((await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${before.body.token}`)).status).toBe(401);
  });

  it('answers an unknown address exactly like a known one, and sends nothing', async () => {
    const email = uniqueEmail('ghost');
    const res = await request(t.app).post('/api/auth/password-reset').send({ email });
    expect(res.status).toBe(202);
    expect(await messagesTo(email)).toEqual([]);
  });

  it('refuses an expired link', async () => {
    const user = await createUser('late');
    await request(t.app).post('/api/auth/password-reset').send({ email: user.email });
    const token = new URL(firstLink((await waitForMessage(user.email, 'Reset')).text, '/reset-password')).searchParams.get('token')!;
    await t.sequelize.query('UPDATE password_resets SET expires_at = now() - interval \'1 minute\' WHERE user_id = :id', {
      replacements: { id: user.id },
    });
    const res = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'a brand new password' });
    expect(res.status).toBe(400);
  });
});

describe('rate limits on sign-in and reset requests', () => {
  it('after the limit of failed sign-ins, answers 429 with a message saying how long to wait', async () => {
    const t = buildTestApp({ AUTH_RATE_LIMIT: '3' });
    // A client address of this test alone, as a trusted (loopback) proxy reports it.
    const client = { 'X-Forwarded-For': `2001:db8::${randomUUID().slice(0, 4)}` };
    try {
      const user = await createUser('limited');
      const statuses: number[] = [];
      for (let i = 0; i < 4; i += 1) {
        statuses.push((await request(t.app).post('/api/auth/sign-in').set(client).send({ email: user.email, password: 'wrong password' })).status);
      }
      expect(statuses).toEqual([401, 401, 401, 429]);
      const limited = await request(t.app).post('/api/auth/sign-in').set(client).send({ email: user.email, password: TEST_PASSWORD });
      expect(limited.status).toBe(429);
      expect(limited.headers['retry-after']).toMatch(/^\d+$/);
      expect(limited.body.error.code).toBe('rate_limited');
      expect(limited.body.error.message).toMatch(/wait \d+ minutes? and try again/);
      for (let i = 0; i < 3; i += 1) expect((await request(t.app).post('/api/auth/password-reset').set(client).send({ email: user.email })).status).toBe(202);
      expect((await request(t.app).post('/api/auth/password-reset').set(client).send({ email: user.email })).status).toBe(429);
    } finally {
      await t.close();
    }
  });
});
