// npm run bench: each benchmark beside its floor in the same run, several rounds, medians; CPU
// per request read from /proc (it holds up when other work shares the machine). Prints a table
// and writes one JSON line per figure to .artifacts/bench.json: {name, ours, floor, ratio, unit, goal}.
import { fork, spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import autocannon from 'autocannon';
import express from 'express';
import expressStaticGzip from 'express-static-gzip';
import { chromium } from 'playwright-core';
import nodemailer from 'nodemailer';
import { QueryTypes } from 'sequelize';
import { Trial } from '../../db/models';
import { createSequelize } from '../../db/sequelize';
import { loadConfig } from '../../server/config';
import { issueSessionToken } from '../../server/auth/session-token';
import { refreshFindings } from '../../server/findings/findings.service';
import { runMailTick } from '../../server/jobs/tick';
import { createMailer } from '../../server/mail/mailer';
import { scratchDatabase } from './db';
import { seedBenchTrial, type BenchWorld } from './world';

const ROOT = path.resolve(__dirname, '../..');
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);
const JWT_SECRET = 'bench-only-secret-0123456789-abcdefghijklmnop';
type Line = { name: string; ours: number; floor: number | null; ratio: number | null; unit: string; goal: string; pass: boolean | null };
const lines: Line[] = [];
/** BENCH_ONLY=reads,mail … runs some sections (while working on one); the default is all of them. */
const ONLY = process.env.BENCH_ONLY?.split(',');
const only = (section: string) => !ONLY || ONLY.includes(section);

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2) : NaN;
};
const round = (x: number, d = 2) => Math.round(x * 10 ** d) / 10 ** d;
function record(name: string, ours: number, floor: number | null, unit: string, goal: { ratioAtMost?: number; oursAtMost?: number; oursAtLeast?: number }) {
  const ratio = floor ? ours / floor : null;
  let pass: boolean | null = null;
  const text: string[] = [];
  if (goal.ratioAtMost !== undefined && ratio !== null) {
    pass = ratio <= goal.ratioAtMost;
    text.push(`ratio ≤ ${goal.ratioAtMost}`);
  }
  if (goal.oursAtMost !== undefined) {
    pass = (pass ?? true) && ours <= goal.oursAtMost;
    text.push(`≤ ${goal.oursAtMost} ${unit}`);
  }
  if (goal.oursAtLeast !== undefined) {
    pass = (pass ?? true) && ours >= goal.oursAtLeast;
    text.push(`≥ ${goal.oursAtLeast} ${unit}`);
  }
  const line = { name, ours: round(ours), floor: floor === null ? null : round(floor), ratio: ratio === null ? null : round(ratio), unit, goal: text.join(', ') || 'reported', pass };
  lines.push(line);
  console.log(`  ${name.padEnd(58)} ${String(line.ours).padStart(10)} ${String(line.floor ?? '—').padStart(10)} ${String(line.ratio ?? '—').padStart(7)} ${unit.padEnd(8)} ${line.goal.padEnd(22)} ${pass === null ? '' : pass ? 'ok' : 'MISSED'}`);
}

/** CPU time (user + system) of a process so far, ms. */
function cpuMs(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  const ticks = Number(fields[11]) + Number(fields[12]);
  return (ticks * 1000) / 100;
}
function memKb(pid: number, field: 'VmRSS' | 'VmHWM'): number {
  const m = new RegExp(`${field}:\\s+(\\d+)`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) : NaN;
}

async function waitFor(url: string, ms = 60_000) {
  const end = Date.now() + ms;
  for (;;) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      /* not up yet */
    }
    if (Date.now() > end) throw new Error(`${url} did not answer`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

function startServer(env: Record<string, string>, command: string[]): Promise<ChildProcess> {
  // BENCH_NODE_ARGS="--cpu-prof --cpu-prof-dir=.artifacts/prof" profiles the server while working on a figure.
  command = [...(process.env.BENCH_NODE_ARGS?.split(' ').filter(Boolean) ?? []), ...command];
  const child = spawn(process.execPath, command, { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'ignore', 'inherit'] });
  return waitFor(`http://127.0.0.1:${env.PORT}/api/health/live`).then(() => child);
}
const stop = (child: ChildProcess) =>
  new Promise<void>((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });

/** Closed-loop load at a number of connections: requests/s, latency percentiles and CPU of the server per request. */
async function load(pid: number, url: string, headers: Record<string, string>, connections: number, seconds: number) {
  const before = cpuMs(pid);
  const result = await autocannon({ url, connections, duration: seconds, headers });
  const cpu = cpuMs(pid) - before;
  const done = result.requests.total || 1;
  return { rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, cpuPerRequest: cpu / done, non2xx: result.non2xx, errors: result.errors + result.timeouts };
}

/** One request; status 0 means no answer, and `error` says why (a timeout, a reset connection …). */
function request(port: number, method: string, pathname: string, headers: Record<string, string>, body?: unknown, agent?: http.Agent): Promise<{ status: number; ms: number; error?: string }> {
  const data = body === undefined ? undefined : JSON.stringify(body);
  const started = performance.now();
  return new Promise((resolve) => {
    const req = http.request({ host: '127.0.0.1', port, method, path: pathname, agent, headers: { ...headers, ...(data ? { 'content-type': 'application/json', 'content-length': Buffer.byteLength(data) } : {}) } }, (res) => {
      res.resume();
      res.on('end', () => resolve({ status: res.statusCode ?? 0, ms: performance.now() - started }));
    });
    req.setTimeout(120_000, () => {
      req.destroy();
      resolve({ status: 0, ms: performance.now() - started, error: 'no answer in 120 s' });
    });
    req.on('error', (error: NodeJS.ErrnoException) => resolve({ status: 0, ms: performance.now() - started, error: error.code ?? error.message }));
    if (data) req.write(data);
    req.end();
  });
}

/** The JS every first visit loads: the entry bundle and, with routes split, the chunk they share. */
function exportedBytes(dir: string) {
  const js = path.join(dir, '_expo/static/js/web');
  const files = readdirSync(js).filter((f) => /^(entry|__common)-.*\.js$/.test(f));
  if (!files.some((f) => f.startsWith('entry-'))) throw new Error(`no entry bundle in ${js}`);
  const size = (f: string) => (existsSync(path.join(js, f)) ? statSync(path.join(js, f)).size : NaN);
  return {
    raw: files.reduce((s, f) => s + size(f), 0),
    br: files.reduce((s, f) => s + size(`${f}.br`), 0),
    gz: files.reduce((s, f) => s + size(`${f}.gz`), 0),
  };
}

/** A bare Expo Router app of the same SDK (one screen), exported beside ours: the first-load floor. */
async function exportBare(): Promise<string> {
  const dir = path.join(ROOT, '.artifacts/bare-app');
  if (existsSync(path.join(dir, 'dist/index.html'))) return path.join(dir, 'dist');
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(path.join(dir, 'app'), { recursive: true });
  writeFileSync(path.join(dir, 'package.json'), JSON.stringify({ name: 'bare-app', private: true, main: 'expo-router/entry' }));
  writeFileSync(path.join(dir, 'app.json'), JSON.stringify({ expo: { name: 'bare', slug: 'bare', web: { bundler: 'metro', output: 'single' }, plugins: ['expo-router'] } }));
  writeFileSync(path.join(dir, 'app/_layout.tsx'), "import { Slot } from 'expo-router';\nexport default function Layout() { return <Slot />; }\n");
  writeFileSync(path.join(dir, 'app/index.tsx'), "import { Text, View } from 'react-native';\nexport default function Home() { return <View><Text>Hello</Text></View>; }\n");
  symlinkSync(path.join(ROOT, 'node_modules'), path.join(dir, 'node_modules'));
  const run = (command: string, args: string[]) =>
    new Promise<void>((resolve, reject) => {
      const child = spawn(command, args, { cwd: dir, stdio: 'ignore', env: process.env });
      child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${command} ${args.join(' ')} failed (${code})`))));
    });
  await run(path.join(ROOT, 'node_modules/.bin/expo'), ['export', '--platform', 'web', '--output-dir', 'dist']);
  await run(process.execPath, [path.join(ROOT, 'scripts/precompress.mjs'), 'dist']);
  return path.join(dir, 'dist');
}

const FLOOR_SQL = `SELECT e.size_id, a->>'kind' AS kind, count(*) AS n, avg((a->>'amountMm')::float) AS mean
  FROM enrollments e JOIN reports r ON r.enrollment_id = e.id AND r.submitted_at IS NOT NULL
  CROSS JOIN LATERAL jsonb_array_elements(r.content->'alterations') a WHERE e.trial_id = $1 GROUP BY 1, 2`;

async function main() {
  const started = Date.now();
  console.log(`Basted benchmarks — ${new Date().toISOString()} — ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, load ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);
  console.log(`  ${'name'.padEnd(58)} ${'ours'.padStart(10)} ${'floor'.padStart(10)} ${'ratio'.padStart(7)} ${'unit'.padEnd(8)} goal`);
  const db = await scratchDatabase();
  const sequelize = createSequelize(db.url, { poolMax: 6 });
  const sink = fork(path.join(__dirname, 'smtp-sink.ts'), [], { execArgv: ['--import', 'tsx'], stdio: ['ignore', 'ignore', 'inherit', 'ipc'] });
  const ask = <T>(message: object) => new Promise<T>((resolve) => sink.once('message', (m) => resolve(m as T)) && sink.send(message));
  const sinkPort = await new Promise<number>((resolve) => sink.once('message', (m: { port: number }) => resolve(m.port)));
  const port = Number(process.env.PORT ?? 8080) + 1;
  const env = { DATABASE_URL: db.url, PORT: String(port), LOG_REQUESTS: 'false', NODE_ENV: 'development', JWT_SECRET, SMTP_PORT: String(sinkPort), WEB_DIST: 'dist' };
  const config = loadConfig({ ...process.env, ...env });
  const token = (userId: string) => `Bearer ${issueSessionToken({ id: userId, sessionVersion: 0 }, config.auth)}`;
  try {
    // ---- data
    const worlds: Record<number, BenchWorld> = {};
    // Only the trials the chosen sections use (all of them by default).
    const sizes = [500, 2000, 3000, 8000].filter(
      (n) =>
        (only('recompute') && n !== 2000) || (only('reads') && n !== 3000) || (only('submit') && n !== 2000) || (only('burst') && n === 2000),
    );
    for (const n of sizes) worlds[n] = await seedBenchTrial(sequelize, { testers: n, ready: n === 2000 ? 1000 : 30, label: `t${n}` });
    await sequelize.query('VACUUM ANALYZE');
    // Every trial's findings current before the server starts (reads then measure reading).
    for (const n of sizes) await refreshFindings((await Trial.findByPk(worlds[n].trialId))!);

    // ---- findings recompute against the raw SQL aggregate of the same rows
    for (const n of only('recompute') ? [500, 3000, 8000] : []) {
      const trial = (await Trial.findByPk(worlds[n].trialId))!;
      await refreshFindings(trial);
      const ours: number[] = [];
      const floor: number[] = [];
      for (let r = 0; r < ROUNDS; r += 1) {
        let t0 = performance.now();
        await sequelize.query(FLOOR_SQL, { bind: [trial.id], type: QueryTypes.SELECT });
        floor.push(performance.now() - t0);
        await sequelize.query('UPDATE trials SET findings_computed_revision = 0 WHERE id = $1', { bind: [trial.id] });
        t0 = performance.now();
        await refreshFindings(trial);
        ours.push(performance.now() - t0);
      }
      record(`findings recompute, ${n} reports (vs SQL GROUP BY size, kind)`, median(ours), median(floor), 'ms', { ratioAtMost: 2 });
    }

    // ---- the server: built bundle, job queue on
    let server = await startServer(env, ['--enable-source-maps', 'dist-server/index.js']);
    const pid = server.pid!;
    const base = `http://127.0.0.1:${port}`;
    const owner = (n: number) => ({ Authorization: token(worlds[n].ownerId) });
    const trialPath = (n: number) => `/api/studios/${worlds[n].studioId}/trials/${worlds[n].trialId}`;
    const trivial = `${base}/api/health/live`;
    // Warm every route once (and the findings snapshot).
    for (const n of sizes.filter((x) => x !== 3000)) await fetch(`${base}${trialPath(n)}/findings`, { headers: owner(n) });

    // ---- reads at 100 connections: CPU per request against the trivial authenticated route
    const routes = ['', '/applications', '/coverage', '/reports', '/enrollments', '/mail', '/photos'];
    const readOurs = new Map<string, { cpu: number[]; p99: number[]; bad: number }>();
    const floorCpu: number[] = [];
    const floorP99: number[] = [];
    for (let r = 0; r < (only('reads') ? ROUNDS : 0); r += 1) {
      const f = await load(pid, trivial, owner(500), 100, 5);
      floorCpu.push(f.cpuPerRequest);
      floorP99.push(f.p99);
      for (const route of [...routes.map((x) => `500${x}`), '2000/findings', '8000/findings']) {
        const [n, sub] = [Number(route.split('/')[0]), route.slice(route.indexOf('/') === -1 ? route.length : route.indexOf('/'))];
        const res = await load(pid, `${base}${trialPath(n)}${sub}`, owner(n), 100, 5);
        const held = readOurs.get(route) ?? { cpu: [], p99: [], bad: 0 };
        held.cpu.push(res.cpuPerRequest);
        held.p99.push(res.p99);
        held.bad += res.non2xx + res.errors;
        readOurs.set(route, held);
      }
    }
    for (const [route, m] of readOurs) {
      const label = route.startsWith('500') ? `trial page read ${route.slice(3) || '/ (trial)'} (500 testers)` : `findings read, current (${route.split('/')[0]} reports)`;
      record(`${label}: CPU per request`, median(m.cpu), median(floorCpu), 'ms', { ratioAtMost: 2 });
      record(`${label}: p99 at 100 connections (floor: trivial route p99)`, median(m.p99), median(floorP99), 'ms', { oursAtMost: 100 });
      if (m.bad) record(`${label}: non-2xx or errors`, m.bad, null, 'count', { oursAtMost: 0 });
    }
    // Reports answer in pages.
    if (only('reads')) {
      const page = await fetch(`${base}${trialPath(8000)}/reports`, { headers: owner(8000) });
      record('reports list, 8000 testers: bytes of one answer', Number((await page.arrayBuffer()).byteLength), null, 'B', { oursAtMost: 1_000_000 });
    }

    // ---- health: the deep check (kept a few seconds) against liveness
    if (only('reads')) {
      const deep: number[] = [];
      const live: number[] = [];
      for (let r = 0; r < ROUNDS; r += 1) {
        live.push((await load(pid, trivial, {}, 100, 2)).rps);
        deep.push((await load(pid, `${base}/api/health`, {}, 100, 2)).rps);
      }
      record('deep health check: requests/s (floor: liveness)', median(deep), median(live), 'req/s', { ratioAtMost: Infinity, oursAtLeast: 0.5 * median(live) });
    }

    // ---- a submission against a plain write (saving the same report), one at a time
    for (const n of only('submit') ? [500, 3000, 8000] : []) {
      const ready = worlds[n].ready;
      const writes: number[] = [];
      const submits: number[] = [];
      for (let i = 0; i < Math.min(ready.length, 24); i += 1) {
        const t = ready[i];
        const headers = { Authorization: token(t.userId) };
        const write = await request(port, 'PUT', `/api/me/enrollments/${t.enrollmentId}/reports/final`, headers, { verdict: `Saved again ${i}` });
        const submit = await request(port, 'POST', `/api/me/enrollments/${t.enrollmentId}/reports/final/submit`, headers);
        if (write.status !== 200 || submit.status !== 200) throw new Error(`submission ${n}: ${write.status} ${submit.status}`);
        if (i >= 4) {
          writes.push(write.ms);
          submits.push(submit.ms);
        }
      }
      record(`submission, ${n} reports (vs saving the report)`, median(submits), median(writes), 'ms', { ratioAtMost: 1.5 });
    }

    // ---- 50 submissions a second for 20 s on a trial of 2000 reports
    if (only('burst')) {
      const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });
      const ready = worlds[2000].ready;
      const hwmBefore = memKb(pid, 'VmHWM');
      const results: Promise<{ status: number; ms: number; error?: string }>[] = [];
      const t0 = Date.now();
      for (let i = 0; i < 1000; i += 1) {
        const wait = t0 + i * 20 - Date.now();
        if (wait > 0) await new Promise((r) => setTimeout(r, wait));
        const t = ready[i];
        results.push(request(port, 'POST', `/api/me/enrollments/${t.enrollmentId}/reports/final/submit`, { Authorization: token(t.userId) }, undefined, agent));
      }
      const done = await Promise.all(results);
      const ms = done.map((d) => d.ms);
      // What happened to each submission: answered or not, and whether the report is stored as submitted.
      const stored = new Set(
        (
          await sequelize.query<{ enrollment_id: string }>(`SELECT enrollment_id FROM reports WHERE stage = 'final' AND submitted_at IS NOT NULL AND enrollment_id = ANY($1::uuid[])`, {
            bind: [ready.slice(0, 1000).map((t) => t.enrollmentId)],
            type: QueryTypes.SELECT,
          })
        ).map((r) => r.enrollment_id),
      );
      const unanswered = done.filter((d) => d.status === 0);
      const why = new Map<string, number>();
      for (const d of done) if (d.status !== 200) why.set(d.error ?? `HTTP ${d.status}`, (why.get(d.error ?? `HTTP ${d.status}`) ?? 0) + 1);
      if (why.size) console.log(`  burst: not answered 200: ${[...why].map(([k, v]) => `${v} × ${k}`).join(', ')}`);
      const lost = ready.slice(0, 1000).filter((t) => !stored.has(t.enrollmentId)).length;
      const fiveXx = done.filter((d) => d.status >= 500).length;
      const trivialAtRate = (await load(pid, trivial, owner(2000), 1, 2)).p50;
      const sorted = [...ms].sort((a, b) => a - b);
      record('submissions 50/s for 20 s (2000 reports): p99 (floor: trivial route)', sorted[Math.ceil(sorted.length * 0.99) - 1], trivialAtRate, 'ms', { oursAtMost: 500 });
      record('submissions 50/s for 20 s: lost (report not stored as submitted)', lost, null, 'count', { oursAtMost: 0 });
      record('submissions 50/s for 20 s: no answer (timeout or dropped connection)', unanswered.length, null, 'count', { oursAtMost: 0 });
      record('submissions 50/s for 20 s: 5xx answers', fiveXx, null, 'count', { oursAtMost: 0 });
      record('server peak memory during the burst (VmHWM)', memKb(pid, 'VmHWM') / 1024, hwmBefore / 1024, 'MB', { oursAtMost: 600 });
      // The findings catch up within seconds of the burst.
      const caughtUp = Date.now();
      for (;;) {
        const f = (await (await fetch(`${base}${trialPath(2000)}/findings`, { headers: owner(2000) })).json()) as { pending: boolean; input: { testers: number } };
        // Done when nothing waits (submissions that got no answer may not have been recorded).
        if (!f.pending) break;
        if (Date.now() - caughtUp > 120_000) break;
        await new Promise((r) => setTimeout(r, 250));
      }
      record('findings current again after the burst', (Date.now() - caughtUp) / 1000, null, 's', { oursAtMost: 30 });
      agent.destroy();
    }

    // ---- memory of the server process: built bundle against tsx
    const builtRss = memKb(pid, 'VmRSS');
    await stop(server);
    if (only('memory')) {
      const idle: number[] = [];
      const tsxIdle: number[] = [];
      for (let r = 0; r < 2; r += 1) {
        server = await startServer(env, ['--enable-source-maps', 'dist-server/index.js']);
        await new Promise((res) => setTimeout(res, 1500));
        idle.push(memKb(server.pid!, 'VmRSS') / 1024);
        await stop(server);
        server = await startServer(env, ['--import', 'tsx', 'server/index.ts']);
        await new Promise((res) => setTimeout(res, 1500));
        tsxIdle.push(memKb(server.pid!, 'VmRSS') / 1024);
        await stop(server);
      }
      record('server idle memory, built bundle (floor: under tsx)', median(idle), median(tsxIdle), 'MB', { ratioAtMost: 1 });
      record('server memory after the benchmarks (RSS)', builtRss / 1024, null, 'MB', {});
    }

    // ---- first load: the JS of the first screen against a bare Expo Router app of the same SDK
    if (only('first-load')) {
      const ours = exportedBytes(path.join(ROOT, 'dist'));
      const bare = exportedBytes(await exportBare());
      record('first load JS, raw bytes (floor: bare Expo Router app)', ours.raw, bare.raw, 'B', { ratioAtMost: 1.3 });
      record('first load JS, Brotli bytes (floor: bare app)', ours.br, bare.br, 'B', { ratioAtMost: 1.3 });
      const fonts = readdirSync(path.join(ROOT, 'dist/assets'), { recursive: true }).map(String).filter((f) => /\.(woff2|ttf)$/.test(f));
      const fontBytes = fonts.filter((f) => /inter-latin/.test(f)).reduce((s, f) => s + statSync(path.join(ROOT, 'dist/assets', f)).size, 0);
      record('text fonts shipped (Inter WOFF2, all weights)', fontBytes, null, 'B', { oursAtMost: 200_000 });

      // First contentful paint, cold (a new browser context each time), 390 × 844, seven loads each,
      // interleaved: Basted through its own server against the bare app from a static server.
      const bareDist = path.join(ROOT, '.artifacts/bare-app/dist');
      const staticApp = express();
      staticApp.use(expressStaticGzip(bareDist, { enableBrotli: true, orderPreference: ['br', 'gzip'], index: false }));
      staticApp.get('/{*splat}', (_req, res) => res.sendFile(path.join(bareDist, 'index.html'), { dotfiles: 'allow' }));
      const staticServer = staticApp.listen(0, '127.0.0.1');
      await new Promise((r) => staticServer.once('listening', r));
      const barePort = (staticServer.address() as { port: number }).port;
      const browser = await chromium.launch({
        executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
        headless: true,
        args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      });
      const fcp = async (url: string) => {
        const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
        const page = await context.newPage();
        await page.goto(url, { waitUntil: 'load' });
        const ms = await page.evaluate(
          () =>
            new Promise<number>((resolve) => {
              const found = performance.getEntriesByName('first-contentful-paint')[0];
              if (found) return resolve(found.startTime);
              new PerformanceObserver((list) => {
                const entry = list.getEntriesByName('first-contentful-paint')[0];
                if (entry) resolve(entry.startTime);
              }).observe({ type: 'paint', buffered: true });
              setTimeout(() => resolve(NaN), 15_000);
            }),
        );
        await context.close();
        return ms;
      };
      const oursFcp: number[] = [];
      const bareFcp: number[] = [];
      try {
        server = await startServer(env, ['--enable-source-maps', 'dist-server/index.js']);
        for (let i = 0; i < 7; i += 1) {
          oursFcp.push(await fcp(`http://127.0.0.1:${port}/sign-in`));
          bareFcp.push(await fcp(`http://127.0.0.1:${barePort}/`));
        }
      } finally {
        await browser.close();
        staticServer.close();
        await stop(server);
      }
      record('first contentful paint, cold, 390×844 (floor: bare app, static server)', median(oursFcp), median(bareFcp), 'ms', { ratioAtMost: 1.3 });
    }

    // ---- reminders: 10,000 due at one instant, against nodemailer's pooled transport alone
    if (only('mail')) {
      await ask({ ask: 'reset' });
      const floorMailer = nodemailer.createTransport({ host: '127.0.0.1', port: sinkPort, secure: false, ignoreTLS: true, pool: true, maxConnections: 5 });
      const t0 = performance.now();
      await Promise.all(Array.from({ length: 2000 }, (_, i) => floorMailer.sendMail({ from: 'bench@basted.test', to: `floor-${i}@bench.test`, subject: `Floor ${i}`, text: 'A reminder-sized message.\n'.repeat(20) })));
      const floorRate = 2000 / ((performance.now() - t0) / 1000);
      floorMailer.close();
      await ask({ ask: 'reset' });
      const due = new Date('2030-03-14T20:00:00Z');
      const at = new Date('2030-03-14T08:30:00Z');
      const world = await seedBenchTrial(sequelize, { testers: 0, ready: 10_000, label: 'mail', dueAt: due });
      await sequelize.query('VACUUM ANALYZE');
      const mailer = createMailer({ ...config.smtp, port: sinkPort });
      // The API beside the worker (here this process runs the tick, as the worker process does):
      // a trivial route asked every 50 ms before and during the sweep and delivery.
      server = await startServer(env, ['--enable-source-maps', 'dist-server/index.js']);
      const pinger = async (run: () => Promise<unknown>) => {
        const child = fork(path.join(__dirname, 'pinger.ts'), [String(port)], { execArgv: ['--import', 'tsx'], stdio: ['ignore', 'ignore', 'inherit', 'ipc'] });
        await new Promise((r) => child.once('message', r));
        const result = await run();
        const ms = await new Promise<number[]>((resolve) => {
          child.once('message', (m: { ms: number[] }) => resolve(m.ms));
          child.send({ ask: 'stop' });
        });
        return { ms, result };
      };
      const quiet = (await pinger(() => new Promise((r) => setTimeout(r, 5000)))).ms;
      const delay = monitorEventLoopDelay({ resolution: 10 });
      delay.enable();
      const t1 = performance.now();
      let tick!: Awaited<ReturnType<typeof runMailTick>>;
      const busy = (
        await pinger(async () => {
          tick = await runMailTick({ config, mailer }, at);
        })
      ).ms;
      const seconds = (performance.now() - t1) / 1000;
      delay.disable();
      mailer.close();
      await stop(server);
      const p99 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.max(0, Math.ceil(xs.length * 0.99) - 1)];
      const counts = await ask<{ messages: number; unique: number; duplicates: number }>({ ask: 'counts' });
      const sent = tick.delivered.filter((d) => d.status === 'sent').length;
      record('10,000 reminders due at once: seconds to deliver (floor: pooled nodemailer alone)', seconds, 10_000 / floorRate, 's', { oursAtMost: 60 });
      record('10,000 reminders: messages received by the SMTP server', counts.messages, 10_000, 'count', { oursAtLeast: 10_000 });
      record('10,000 reminders: sent as recorded in the outbox', sent, 10_000, 'count', { oursAtLeast: 10_000 });
      record('10,000 reminders: duplicates', counts.duplicates, null, 'count', { oursAtMost: 0 });
      record('API during the sweep and delivery: p99 of a trivial route (floor: before)', p99(busy), p99(quiet), 'ms', { oursAtMost: 250 });
      record('API during the sweep and delivery: slowest answer', Math.max(...busy), Math.max(...quiet), 'ms', { oursAtMost: 500 });
      record('worker: longest event-loop stall during the sweep', delay.max / 1e6, null, 'ms', {});
      void world;
    }
    console.log(`  (${((Date.now() - started) / 1000).toFixed(0)} s)`);
  } finally {
    mkdirSync(path.join(ROOT, '.artifacts'), { recursive: true });
    writeFileSync(path.join(ROOT, '.artifacts/bench.json'), lines.map((l) => JSON.stringify(l)).join('\n') + '\n');
    sink.kill();
    await sequelize.close();
    await db.drop();
  }
  const missed = lines.filter((l) => l.pass === false);
  console.log(`${lines.length} figures, ${lines.filter((l) => l.pass).length} within their goal, ${missed.length} missed → .artifacts/bench.json`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
