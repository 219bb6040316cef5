import { execFile, spawn, type ChildProcess } from 'node:child_process';
import { request as httpRequest, createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { promisify } from 'node:util';
import request from 'supertest';
import { OutboxMessage } from '../../../db/models';
import { SESSION_COOKIE } from '../../../server/auth/session-token';
import { createUser, TEST_PASSWORD } from '../../support/factories';
import { startJobQueue } from '../../../server/jobs/queue';
import { createTrialWorld, ownMailDatabase, startMailHarness, type MailHarness } from './mail-support';

const run = promisify(execFile);
const ROOT = path.resolve(__dirname, '../../..');

async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port } = probe.address() as AddressInfo;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return port;
}

/**
 * A load balancer in a few lines: each request goes to the next backend in turn, with the
 * client's address added to X-Forwarded-For and the backend that answered in X-Served-By.
 */
function roundRobinProxy(backends: number[]): Promise<{ port: number; server: Server }> {
  let next = 0;
  const server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const index = next++ % backends.length;
    const forwarded = [req.headers['x-forwarded-for'], req.socket.remoteAddress].filter(Boolean).join(', ');
    const upstream = httpRequest(
      { host: '127.0.0.1', port: backends[index], method: req.method, path: req.url, headers: { ...req.headers, 'x-forwarded-for': forwarded } },
      (answer) => {
        res.writeHead(answer.statusCode ?? 502, { ...answer.headers, 'x-served-by': String(index) });
        answer.pipe(res);
      },
    );
    upstream.on('error', () => {
      res.writeHead(502);
      res.end();
    });
    req.pipe(upstream);
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve({ port: (server.address() as AddressInfo).port, server })));
}

/** The real server (server/index.ts: migrations, job queue, listen) as its own process. */
async function startInstance(env: NodeJS.ProcessEnv): Promise<{ child: ChildProcess; port: number; output: string[] }> {
  const port = await freePort();
  const output: string[] = [];
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: ROOT, env: { ...env, PORT: String(port), HOST: '127.0.0.1' }, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
  child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
  const until = Date.now() + 60_000;
  for (;;) {
    if (output.join('').includes('Basted listening')) return { child, port, output };
    if (child.exitCode !== null || Date.now() > until) throw new Error(`instance did not start:\n${output.join('')}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function stopInstance(instance: { child: ChildProcess } | undefined) {
  if (!instance || instance.child.exitCode !== null) return;
  const exited = new Promise((resolve) => instance.child.once('exit', resolve));
  instance.child.kill('SIGTERM');
  await Promise.race([exited, new Promise((r) => setTimeout(r, 12_000))]);
}

describe('two API processes on one database behind a load balancer', () => {
  let h: MailHarness;
  let a: Awaited<ReturnType<typeof startInstance>> | undefined;
  let b: Awaited<ReturnType<typeof startInstance>> | undefined;
  let proxy: { port: number; server: Server };
  let env: NodeJS.ProcessEnv;

  beforeAll(async () => {
    h = await startMailHarness();
    env = {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: h.databaseUrl,
      SMTP_PORT: String(h.capture.port),
      PUBLIC_URL: 'http://basted.test',
      LOG_REQUESTS: 'false',
      AUTH_RATE_LIMIT: '3',
      TRUST_PROXY: 'loopback',
    };
    [a, b] = await Promise.all([startInstance(env), startInstance(env)]);
    proxy = await roundRobinProxy([a.port, b.port]);
  }, 120_000);

  afterAll(async () => {
    await new Promise<void>((resolve) => proxy?.server.close(() => resolve()));
    await Promise.all([stopInstance(a), stopInstance(b)]);
    await h.close();
  });

  const lb = () => request(`http://127.0.0.1:${proxy.port}`);
  const direct = (instance: { port: number }) => request(`http://127.0.0.1:${instance.port}`);

  it('a session started on one instance is valid on both, and signing out on one ends it on both', async () => {
    const user = await createUser('two-sessions');
    const signIn = await lb().post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const cookie = ([] as string[]).concat(signIn.headers['set-cookie'] ?? []).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!.split(';')[0];
    const seen = new Set<string>();
    for (let i = 0; i < 4; i += 1) {
      const res = await lb().get('/api/auth/session').set('Cookie', cookie);
      expect(res.status).toBe(200);
      seen.add(res.headers['x-served-by']);
    }
    expect([...seen].sort()).toEqual(['0', '1']);

    const out = await direct(b!).post('/api/auth/sign-out').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect((await direct(a!).get('/api/auth/session').set('Cookie', cookie)).status).toBe(401);
    expect((await direct(b!).get('/api/auth/session').set('Cookie', cookie)).status).toBe(401);
  });

  it('rate limits are counted together: failed sign-ins spread over both instances lock the client on both', async () => {
    const user = await createUser('two-limits');
    const client = { 'X-Forwarded-For': '2001:db8::2:1' };
    const statuses: [number, string][] = [];
    for (let i = 0; i < 4; i += 1) {
      const res = await lb().post('/api/auth/sign-in').set(client).send({ email: user.email, password: 'a wrong guess' });
      statuses.push([res.status, res.headers['x-served-by']]);
    }
    expect(statuses.map(([s]) => s)).toEqual([401, 401, 401, 429]);
    expect(new Set(statuses.map(([, by]) => by)).size).toBe(2);
    // Locked on each instance alike; another client behind the same balancer is not.
    for (const instance of [a!, b!]) {
      expect((await direct(instance).post('/api/auth/sign-in').set({ 'X-Forwarded-For': '2001:db8::2:1' }).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(429);
    }
    expect((await lb().post('/api/auth/sign-in').set({ 'X-Forwarded-For': '2001:db8::2:2' }).send({ email: user.email, password: TEST_PASSWORD })).status).toBe(200);
  });

  it('one reminder per tester while both instances run their job queues and two mail clocks race', async () => {
    // Due in 40 days, so the instances' own sweeps (on the real clock) have nothing to send yet;
    // the racing clocks stand 3 days before, at 08:05 in the testers' zone.
    const due = new Date(Date.now() + 40 * 86_400_000);
    due.setUTCHours(17, 0, 0, 0);
    const at = new Date(due.getTime() - 3 * 86_400_000);
    at.setUTCHours(8, 5, 0, 0);
    const w = await createTrialWorld({ zones: Array.from({ length: 8 }, () => 'UTC'), dues: { 'final-report': due } });
    const tick = () => run(process.execPath, ['--import', 'tsx', 'scripts/mail-tick.ts', '--at', at.toISOString()], { cwd: ROOT, env, timeout: 60_000 });
    await Promise.all([tick(), tick()]);
    for (const t of w.testers) {
      expect(h.capture.to(t.user.email).map((m) => m.subject)).toEqual(['Due in 3 days: final report, Reminder trial']);
    }
    const rows = await OutboxMessage.findAll({ where: { trialId: w.trial.id } });
    expect(rows).toHaveLength(8);
    expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
    // Both instances stayed up throughout.
    expect((await direct(a!).get('/api/health')).status).toBeLessThan(600);
    expect(a!.child.exitCode).toBeNull();
    expect(b!.child.exitCode).toBeNull();
  });
});

describe('instances starting together', () => {
  it('job queues of several instances start at once on fresh databases without a deadlock', async () => {
    // The race is one of timing: a few fresh databases, four queues starting on each at once.
    for (let round = 0; round < 3; round += 1) {
      const db = await ownMailDatabase();
      const queues: Awaited<ReturnType<typeof startJobQueue>>[] = [];
      try {
        const deps = { config: {} as never, mailer: {} as never };
        const started = await Promise.allSettled(Array.from({ length: 4 }, () => startJobQueue(deps, { databaseUrl: db.url, log: false })));
        for (const s of started) if (s.status === 'fulfilled') queues.push(s.value);
        expect(started.map((s) => (s.status === 'rejected' ? String(s.reason) : 'started'))).toEqual(['started', 'started', 'started', 'started']);
      } finally {
        await Promise.all(queues.map((q) => q.stop()));
        await db.drop();
      }
    }
  });
});
