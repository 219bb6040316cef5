import PgBoss from 'pg-boss';
import { OutboxMessage } from '../../../db/models';
import { MAIL_TICK_QUEUE, OUTBOX_FLUSH_QUEUE, startJobQueue, type JobQueue } from '../../../server/jobs/queue';
import { enqueue } from '../../../server/outbox/outbox.service';
import { startMailHarness, type MailHarness } from './mail-support';

/** pg-boss is only the transport: these check that it carries the work and keeps it across a restart. */
let h: MailHarness;
let queue: JobQueue | null = null;
beforeAll(async () => {
  h = await startMailHarness();
});
afterAll(async () => {
  await queue?.stop();
  await h.close();
});

const deps = () => ({ config: h.t.config, mailer: h.t.mailer });

async function until(check: () => Promise<boolean>, ms = 20_000) {
  const end = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 200));
  }
}

const message = (n: string) =>
  enqueue(deps(), { key: `jobs-test:${n}`, to: { id: null, email: `jobs-${n}@example.test` }, template: 'test', category: 'essential', content: { subject: `Jobs ${n}`, text: 'hello', html: '<p>hello</p>' } });

describe('the job queue', () => {
  it('registers its schedules in PostgreSQL and delivers queued mail when a flush job runs', async () => {
    queue = await startJobQueue(deps(), { databaseUrl: h.databaseUrl, log: false });
    const schedules = await queue.boss.getSchedules();
    expect(schedules.map((s) => [s.name, s.cron]).sort()).toEqual([
      [MAIL_TICK_QUEUE, '*/5 * * * *'],
      [OUTBOX_FLUSH_QUEUE, '* * * * *'],
    ]);
    const row = (await message('one'))!;
    await queue.boss.send(OUTBOX_FLUSH_QUEUE, {});
    await until(async () => (await row.reload()).status === 'sent');
    expect(h.capture.to('jobs-one@example.test')).toHaveLength(1);
  });

  it('a job sent while no worker runs is done after the restart', async () => {
    await queue!.stop();
    queue = null;
    const row = (await message('two'))!;
    // Another process (here a bare client) asks for a sweep while every worker is down.
    const client = new PgBoss({ connectionString: h.databaseUrl, schema: 'pgboss', supervise: false, schedule: false });
    await client.start();
    await client.send(MAIL_TICK_QUEUE, {});
    await client.stop({ graceful: true });
    expect((await row.reload()).status).toBe('queued');

    queue = await startJobQueue(deps(), { databaseUrl: h.databaseUrl, schedule: false, log: false });
    await until(async () => (await row.reload()).status === 'sent');
    expect(h.capture.to('jobs-two@example.test')).toHaveLength(1);
    expect(await OutboxMessage.count({ where: { status: 'sent' } })).toBe(2);
  });
});
