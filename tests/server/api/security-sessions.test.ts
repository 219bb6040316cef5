import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { promisify } from 'node:util';
import jwt from 'jsonwebtoken';
import { SMTPServer } from 'smtp-server';
import request from 'supertest';
import { Invitation, Membership, SignUpRequest, User } from '../../../db/models';
import { SESSION_COOKIE } from '../../../server/auth/session-token';
import { DEVELOPMENT_JWT_SECRET } from '../../../server/config';
import { bearer, createStudioWorld, createUser, TEST_PASSWORD, uniqueEmail } from '../../support/factories';
import { firstLink, messagesTo, waitForMessage } from '../../support/inbox';
import { buildTestApp, type TestApp } from '../../support/test-app';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../../..');

function cookieOf(res: request.Response): string {
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!cookie) throw new Error('no session cookie set');
  return cookie;
}
const tokenOf = (res: request.Response) => cookieOf(res).split(';')[0].split('=')[1];

describe('configuration outside development', () => {
  it('a server started without NODE_ENV refuses to boot on the development defaults, naming each one', async () => {
    // No NODE_ENV at all (Expo's types declare it always present, hence the cast).
    const env = { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/root' } as unknown as NodeJS.ProcessEnv;
    const failed = await run(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: ROOT, env, timeout: 60_000 }).then(
      () => null,
      (error: { code?: number; stderr?: string }) => error,
    );
    expect(failed).not.toBeNull();
    expect(failed!.code).not.toBe(0);
    for (const name of ['JWT_SECRET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY', 'DATABASE_URL', 'NODE_ENV']) expect(failed!.stderr).toContain(name);
  });

  it('production refuses the published development and test secrets', async () => {
    const base = { NODE_ENV: 'production', S3_ACCESS_KEY_ID: 'real-key', S3_SECRET_ACCESS_KEY: 'real-secret', DATABASE_URL: process.env.DATABASE_URL! };
    expect(() => buildTestApp({ ...base, JWT_SECRET: DEVELOPMENT_JWT_SECRET })).toThrow(/JWT_SECRET: this secret is published/);
    expect(() => buildTestApp({ ...base, JWT_SECRET: process.env.JWT_SECRET! })).toThrow(/JWT_SECRET: this secret is published/);
  });

  it('in production the session cookie is Secure', async () => {
    const t = buildTestApp({
      NODE_ENV: 'production',
      JWT_SECRET: randomUUID() + randomUUID(),
      // The local fake store takes any keys; production merely refuses its well-known ones.
      S3_ACCESS_KEY_ID: 'not-the-fake-key',
      S3_SECRET_ACCESS_KEY: 'not-the-fake-secret',
      BCRYPT_COST: '10',
    });
    try {
      const user = await createUser('secure');
      const res = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
      expect(res.status).toBe(200);
      expect(cookieOf(res)).toMatch(/;\s*Secure/i);
    } finally {
      await t.close();
    }
  });
});

describe('session tokens', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('refuses a token without an expiry, one whose subject is not an id (401, not 500), one without a session id, and one that claims to last too long', async () => {
    const user = await createUser('claims');
    const secret = t.config.auth.jwtSecret;
    const tokens = {
      noExpiry: jwt.sign({ ver: 0, sid: randomUUID() }, secret, { subject: user.id }),
      notAnId: jwt.sign({ ver: 0, sid: randomUUID() }, secret, { subject: "1' OR '1'='1", expiresIn: '1d' }),
      noSession: jwt.sign({ ver: 0 }, secret, { subject: user.id, expiresIn: '1d' }),
      tooLong: jwt.sign({ ver: 0, sid: randomUUID() }, secret, { subject: user.id, expiresIn: '400d' }),
      devSecret: jwt.sign({ ver: 0, sid: randomUUID() }, DEVELOPMENT_JWT_SECRET, { subject: user.id, expiresIn: '1d' }),
    };
    for (const [name, token] of Object.entries(tokens)) {
      const byBearer = await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${token}`);
      const byCookie = await request(t.app).get('/api/auth/session').set('Cookie', `${SESSION_COOKIE}=${token}`);
      expect([name, byBearer.status, byCookie.status]).toEqual([name, 401, 401]);
    }
    // The same claims, well formed, are a session.
    expect((await request(t.app).get('/api/auth/session').set('Authorization', bearer(user, t.config))).status).toBe(200);
  });

  it('signing out ends the session itself (cookie or Bearer), not just the cookie, and leaves the other devices signed in', async () => {
    const user = await createUser('signout');
    const laptop = tokenOf(await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }));
    const phone = tokenOf(await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }));
    expect((await request(t.app).get('/api/auth/session').set('Cookie', `${SESSION_COOKIE}=${laptop}`)).status).toBe(200);

    expect((await request(t.app).post('/api/auth/sign-out').set('Cookie', `${SESSION_COOKIE}=${laptop}`)).status).toBe(204);
    // A copy of the token (kept by an attacker, or a second tab) no longer works, however sent.
    expect((await request(t.app).get('/api/auth/session').set('Cookie', `${SESSION_COOKIE}=${laptop}`)).status).toBe(401);
    expect((await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${laptop}`)).status).toBe(401);
    expect((await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${phone}`)).status).toBe(200);
    // An API client signs out with its Bearer token the same way.
    expect((await request(t.app).post('/api/auth/sign-out').set('Authorization', `Bearer ${phone}`)).status).toBe(204);
    expect((await request(t.app).get('/api/auth/session').set('Authorization', `Bearer ${phone}`)).status).toBe(401);
  });

  it('no answer body carries the session token: the web app holds it only in the httpOnly cookie', async () => {
    const user = await createUser('nobody-token');
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    const token = tokenOf(signIn);
    expect(JSON.stringify(signIn.body)).not.toContain(token);
    expect(signIn.body.token).toBeUndefined();
    const session = await request(t.app).get('/api/auth/session').set('Cookie', `${SESSION_COOKIE}=${token}`);
    expect(JSON.stringify(session.body)).not.toContain(token);
  });

  it('removing a member or changing their role takes effect on their very next request with the same session', async () => {
    const w = await createStudioWorld();
    const token = tokenOf(await request(t.app).post('/api/auth/sign-in').send({ email: w.users.grader.email, password: TEST_PASSWORD }));
    const asGrader = { Cookie: `${SESSION_COOKIE}=${token}` };
    const owner = { Authorization: bearer(w.users.owner, t.config) };
    expect((await request(t.app).get(`/api/studios/${w.studio.id}/patterns`).set(asGrader)).status).toBe(200);

    await request(t.app).patch(`/api/studios/${w.studio.id}/members/${w.memberships.grader.id}`).set(owner).send({ role: 'tester' }).expect(200);
    expect((await request(t.app).get(`/api/studios/${w.studio.id}/patterns`).set(asGrader)).status).toBe(403);

    await request(t.app).delete(`/api/studios/${w.studio.id}/members/${w.memberships.grader.id}`).set(owner).expect(204);
    expect((await request(t.app).get(`/api/studios/${w.studio.id}`).set(asGrader)).status).toBe(404);
  });
});

describe('confirmed addresses and invitations', () => {
  let t: TestApp;
  beforeAll(() => {
    t = buildTestApp();
  });
  afterAll(() => t.close());

  it('someone holding a forwarded invitation link cannot sign up as the invited address and join: the account needs the link sent to that address', async () => {
    const w = await createStudioWorld();
    const invited = uniqueEmail('invited-grader');
    await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set('Authorization', bearer(w.users.owner, t.config)).send({ email: invited, role: 'grader' }).expect(201);
    const invitationLink = firstLink((await waitForMessage(invited, 'Invitation to')).text, '/invitations/');
    const inviteToken = new URL(invitationLink).pathname.split('/').pop()!;

    // The holder of the forwarded link signs up with the invited address and a password of theirs.
    const attempt = await request(t.app).post('/api/auth/sign-up').send({ name: 'Not the invitee', email: invited, password: 'attacker chosen password', next: `/invitations/${inviteToken}` });
    expect(attempt.status).toBe(202);
    expect(attempt.headers['set-cookie']).toBeUndefined();
    expect(await User.count({ where: { email: invited } })).toBe(0);
    const signIn = await request(t.app).post('/api/auth/sign-in').send({ email: invited, password: 'attacker chosen password' });
    expect(signIn.status).toBe(401);
    expect(await Membership.count({ where: { studioId: w.studio.id, role: 'grader' } })).toBe(1);

    // Only the mailbox of the invited address gets the link that makes the account.
    const confirm = firstLink((await waitForMessage(invited, 'Confirm your e-mail address')).text, '/verify-email');
    const made = await request(t.app).post('/api/auth/verify-email').send({ token: new URL(confirm).searchParams.get('token') });
    expect(made.status).toBe(201);
    expect(made.body.next).toBe(`/invitations/${inviteToken}`);
    const accepted = await request(t.app).post(`/api/invitations/${inviteToken}/accept`).set('Cookie', cookieOf(made).split(';')[0]);
    expect(accepted.status).toBe(200);
    expect(accepted.body.role).toBe('grader');
  });

  it('an account whose address was never confirmed cannot accept an invitation to that address', async () => {
    const w = await createStudioWorld();
    const unconfirmed = await createUser('unconfirmed', { verified: false });
    await request(t.app).post(`/api/studios/${w.studio.id}/invitations`).set('Authorization', bearer(w.users.owner, t.config)).send({ email: unconfirmed.email, role: 'grader' }).expect(201);
    const inviteToken = new URL(firstLink((await waitForMessage(unconfirmed.email, 'Invitation to')).text, '/invitations/')).pathname.split('/').pop()!;
    const res = await request(t.app).post(`/api/invitations/${inviteToken}/accept`).set('Authorization', bearer(unconfirmed, t.config));
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/Confirm your e-mail address/);
    expect(await Membership.count({ where: { studioId: w.studio.id, userId: unconfirmed.id } })).toBe(0);
    expect((await Invitation.findOne({ where: { email: unconfirmed.email.toLowerCase() } }))!.acceptedAt).toBeNull();
  });

  it('a sign-up link points only at a path of the site', async () => {
    const res = await request(t.app).post('/api/auth/sign-up').send({ name: 'Next', email: uniqueEmail('next'), password: 'a long enough pass', next: '//evil.example.test/x' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['next']);
    expect(await SignUpRequest.count({ where: { name: 'Next' } })).toBe(0);
  });
});

/** An SMTP server that takes 1.5 s over each message, like a slow provider. */
async function slowSmtp(): Promise<{ port: number; close(): Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, _session, callback) {
      stream.resume();
      stream.on('end', () => setTimeout(() => callback(), 1500));
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  return { port: (server.server.address() as AddressInfo).port, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

describe('account discovery', () => {
  it('a password reset answers a real address as fast as an unknown one, even when mail is slow', async () => {
    const smtp = await slowSmtp();
    const t = buildTestApp({ SMTP_PORT: String(smtp.port) });
    try {
      const user = await createUser('timing');
      const known: number[] = [];
      const unknown: number[] = [];
      for (let i = 0; i < 5; i += 1) {
        for (const [email, into] of [[user.email, known], [uniqueEmail('ghost'), unknown]] as const) {
          const started = process.hrtime.bigint();
          const res = await request(t.app).post('/api/auth/password-reset').send({ email });
          into.push(Number(process.hrtime.bigint() - started) / 1e6);
          expect(res.status).toBe(202);
        }
      }
      // Before, the answer for a real address waited for the mail (here 1.5 s); now neither does.
      expect(Math.max(...known)).toBeLessThan(1000);
      expect(Math.abs(median(known) - median(unknown))).toBeLessThan(150);
    } finally {
      await t.close();
      await smtp.close();
    }
  });

  it('sign-up answers a registered address exactly as a new one: same status, same words, no cookie', async () => {
    const t = buildTestApp();
    try {
      const user = await createUser('registered');
      const fresh = uniqueEmail('unregistered');
      const a = await request(t.app).post('/api/auth/sign-up').send({ name: 'Someone', email: user.email, password: 'a long enough pass' });
      const b = await request(t.app).post('/api/auth/sign-up').send({ name: 'Someone', email: fresh, password: 'a long enough pass' });
      expect([a.status, b.status]).toEqual([202, 202]);
      expect(a.body.message.replace(user.email, 'ADDRESS')).toBe(b.body.message.replace(fresh, 'ADDRESS'));
      expect([a.headers['set-cookie'], b.headers['set-cookie']]).toEqual([undefined, undefined]);
      // The difference is only in the mailboxes, which only their owners read.
      await waitForMessage(user.email, 'You already have a Basted account');
      await waitForMessage(fresh, 'Confirm your e-mail address');
      expect((await messagesTo(user.email)).some((m) => m.subject.includes('Confirm'))).toBe(false);
    } finally {
      await t.close();
    }
  });
});
