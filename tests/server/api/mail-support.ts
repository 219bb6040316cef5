import { randomBytes, randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { Client } from 'pg';
import { SMTPServer } from 'smtp-server';
import { Application, Enrollment, Membership, Milestone, Pattern, PatternSize, Report, Studio, Trial, User } from '../../../db/models';
import { migrateUp } from '../../../db/migrator';
import { createSequelize } from '../../../db/sequelize';
import type { MilestoneKind } from '../../../server/domain/trials';
import { createUser, enrolTester } from '../../support/factories';
import { buildTestApp, type TestApp } from '../../support/test-app';

/** `headers` holds each raw header line by its lower-case name. */
export type Captured = { to: string[]; subject: string; text: string; html: string | null; headers: Record<string, string> };

/**
 * An SMTP server in this process on a port of its own (not the shared :1025 one), that can be
 * stopped and started again on the same port to play an outage.
 */
export class MailCapture {
  readonly messages: Captured[] = [];
  /** SMTP connections opened to this server so far. */
  connections = 0;
  port = 0;
  private server: SMTPServer | null = null;

  async start(): Promise<void> {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      onConnect: (_session, callback) => {
        this.connections += 1;
        callback();
      },
      onData: (stream, _session, callback) => {
        simpleParser(stream)
          .then((parsed) => {
            const to = (Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : []).flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase()));
            this.messages.push({ to, subject: parsed.subject ?? '', text: parsed.text ?? '', html: parsed.html || null, headers: Object.fromEntries(parsed.headerLines.map((l) => [l.key, l.line])) });
            callback();
          })
          .catch(callback);
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(this.port, '127.0.0.1', () => resolve());
    });
    this.port = (server.server.address() as AddressInfo).port;
    this.server = server;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  to(address: string): Captured[] {
    return this.messages.filter((m) => m.to.includes(address.toLowerCase()));
  }
}

/**
 * A database of this test file's own, so a tick with a clock far in the future cannot pick up
 * mail that other suites running at the same time are sending.
 */
export async function ownMailDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const adminUrl = process.env.BASTED_ADMIN_DATABASE_URL!;
  const name = `basted_mail_${randomBytes(4).toString('hex')}`;
  const admin = new Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  const migrator = createSequelize(url.toString(), { registerModels: false, poolMax: 3 });
  await migrateUp(migrator);
  await migrator.close();
  return {
    url: url.toString(),
    async drop() {
      const a = new Client({ connectionString: adminUrl });
      await a.connect();
      await a.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await a.end();
    },
  };
}

export type MailHarness = { t: TestApp; capture: MailCapture; databaseUrl: string; close(): Promise<void> };

/** The real app on this file's own database, with its mail going to an in-process SMTP server. */
export async function startMailHarness(): Promise<MailHarness> {
  const db = await ownMailDatabase();
  const previousUrl = process.env.DATABASE_URL;
  process.env.DATABASE_URL = db.url;
  const capture = new MailCapture();
  await capture.start();
  const t = buildTestApp({ SMTP_PORT: String(capture.port), PUBLIC_URL: 'http://basted.test' });
  return {
    t,
    capture,
    databaseUrl: db.url,
    async close() {
      await t.close();
      await capture.stop();
      process.env.DATABASE_URL = previousUrl;
      await db.drop();
    },
  };
}

export type TrialWorld = {
  studio: Studio;
  owner: User;
  coordinator: User;
  trial: Trial;
  size: PatternSize;
  testers: { user: User; application: Application; enrollment: Enrollment }[];
};

/** A running trial in a Lisbon studio with testers in the given time zones, all enrolled. */
export async function createTrialWorld(options: { zones: string[]; dues: Partial<Record<MilestoneKind, Date>> }): Promise<TrialWorld> {
  const studio = await Studio.create({ name: 'Reminder studio', slug: `mail-${randomUUID()}`, timeZone: 'Europe/Lisbon' });
  const owner = await createUser('owner');
  const coordinator = await createUser('coordinator');
  await Membership.create({ studioId: studio.id, userId: owner.id, role: 'owner' });
  await Membership.create({ studioId: studio.id, userId: coordinator.id, role: 'coordinator' });
  const pattern = await Pattern.create({ studioId: studio.id, name: 'Trousers', category: 'trousers', fabricKind: 'woven', bodyColumns: ['hip'] });
  const size = await PatternSize.create({ patternId: pattern.id, label: 'M', position: 0, bodyMm: { hip: 1000 } });
  const trial = await Trial.create({
    studioId: studio.id,
    patternId: pattern.id,
    slug: `mail-trial-${randomUUID().slice(0, 12)}`,
    title: 'Reminder trial',
    state: 'running',
    coverage: { sizes: [{ sizeId: size.id, target: 5 }], heightBands: [], variants: [] },
  });
  for (const [kind, dueAt] of Object.entries(options.dues)) await Milestone.create({ trialId: trial.id, kind: kind as MilestoneKind, dueAt });
  const testers = [];
  for (const [i, zone] of options.zones.entries()) {
    const user = await createUser(`tester${i}`, { name: `Tester ${zone}` });
    await user.update({ timeZone: zone });
    await Membership.create({ studioId: studio.id, userId: user.id, role: 'tester' });
    const { application, enrollment } = await enrolTester(trial.id, user.id, size.id);
    testers.push({ user: (await User.findByPk(user.id))!, application, enrollment });
  }
  return { studio, owner, coordinator, trial, size, testers };
}

/** Marks a report as submitted, as the submit route would once the form is complete. */
export async function markSubmitted(enrollment: Enrollment, stage: 'check-in' | 'final', at = new Date()) {
  await Report.create({ enrollmentId: enrollment.id, stage, content: {}, submittedAt: at });
}
