import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);
const script = path.resolve(__dirname, '../../scripts/pg.sh');

/** Runs scripts/pg.sh against a throw-away cluster on its own port and folder. */
describe('scripts/pg.sh', () => {
  let dir: string;
  const port = String(55000 + Math.floor(Math.random() * 900));
  const pg = (command: string) =>
    run('bash', [script, command], { env: { ...process.env, PGPORT: port, PG_DIR: dir }, timeout: 90_000 });

  beforeAll(async () => {
    dir = await mkdtemp(path.join('/tmp', 'basted-pgtest-'));
  });
  afterAll(async () => {
    await pg('stop').catch(() => undefined);
    await rm(dir, { recursive: true, force: true });
  });

  it('starts a new cluster, and a second start is a no-op', async () => {
    const first = await pg('start');
    expect(first.stderr).toContain(`starting on 127.0.0.1:${port}`);
    const second = await pg('start');
    expect(second.stderr).toContain('already running');
    expect((await pg('status')).stdout).toContain(`running on 127.0.0.1:${port}`);
  });

  it('stops cleanly, and a stale pid file left behind does not block the next start', async () => {
    await pg('stop');
    await expect(pg('status')).rejects.toMatchObject({ code: 3 });
    // The PID of a live process that is not a postmaster: what a reboot can leave behind.
    await writeFile(path.join(dir, 'data', 'postmaster.pid'), `${process.pid}\n${path.join(dir, 'data')}\n`);
    const started = await pg('start');
    expect(started.stderr).toContain('removing stale');
    expect((await pg('status')).stdout).toContain('running');
  });
});
