import { randomBytes } from 'node:crypto';
import { Client } from 'pg';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../../db/sequelize';
import { createMigrator, migrateDownAll, migrateUp } from '../../../db/migrator';
import { migrations } from '../../../db/migrations';
import { DEMO_ACCOUNTS, seedDemoStudio } from '../../../db/seeders/demo-studio';

/** A database of its own, so undoing every migration does not disturb the other suites. */
async function withScratchDatabase(run: (sequelize: Sequelize) => Promise<void>) {
  const adminUrl = process.env.BASTED_ADMIN_DATABASE_URL!;
  const name = `basted_scratch_${randomBytes(4).toString('hex')}`;
  const admin = new Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}"`);
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  const sequelize = createSequelize(url.toString());
  try {
    await run(sequelize);
  } finally {
    await sequelize.close();
    await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    await admin.end();
  }
}

async function tables(sequelize: Sequelize): Promise<string[]> {
  // Cast: Sequelize returns columns of the sql_identifier type as bare arrays.
  const rows = await sequelize.query<{ name: string }>(
    "SELECT table_name::text AS name FROM information_schema.tables WHERE table_schema = 'public' ORDER BY 1",
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.name);
}

describe('migrations', () => {
  it('apply in order, and undoing all of them leaves only the migration log', async () => {
    await withScratchDatabase(async (sequelize) => {
      const applied = await migrateUp(sequelize);
      expect(applied).toEqual(migrations.map((m) => m.name));
      expect(await tables(sequelize)).toEqual(expect.arrayContaining(['users', 'studios', 'memberships']));

      const reverted = await migrateDownAll(sequelize);
      expect(reverted).toEqual(migrations.map((m) => m.name).reverse());
      expect(await tables(sequelize)).toEqual(['schema_migrations']);

      // and the whole chain applies again on the emptied schema
      expect(await migrateUp(sequelize)).toHaveLength(migrations.length);
    });
  });

  it('0020 adds the children’s-wear flag (false for patterns already there), and its down removes only that column', async () => {
    await withScratchDatabase(async (sequelize) => {
      const before = migrations.findIndex((m) => m.name === '0020-pattern-childrens-wear');
      expect(before).toBeGreaterThan(0);
      const migrator = createMigrator(sequelize);
      await migrator.up({ to: migrations[before - 1].name });
      // Plain SQL: the models already know the new column.
      await sequelize.query(
        "INSERT INTO studios (id, name, slug, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000001', 'Flag Studio', 'flag-studio', now(), now()); " +
          "INSERT INTO patterns (id, studio_id, name, category, fabric_kind, created_at, updated_at) VALUES " +
          "('00000000-0000-4000-8000-000000000002', '00000000-0000-4000-8000-000000000001', 'Hoodie', 'top', 'woven', now(), now())",
      );
      const columns = async () =>
        (
          await sequelize.query<{ name: string }>(
            "SELECT column_name::text AS name FROM information_schema.columns WHERE table_name = 'patterns' ORDER BY 1",
            { type: QueryTypes.SELECT },
          )
        ).map((r) => r.name);
      const without = await columns();
      expect(without).not.toContain('childrens_wear');

      await migrator.up({ to: '0020-pattern-childrens-wear' });
      expect(await columns()).toEqual([...without, 'childrens_wear'].sort());
      const flags = await sequelize.query<{ childrens_wear: boolean }>('SELECT childrens_wear FROM patterns', { type: QueryTypes.SELECT });
      expect(flags.length).toBe(1);
      expect(flags.map((f) => f.childrens_wear)).toEqual([false]);

      await migrator.down({ to: '0020-pattern-childrens-wear' });
      expect(await columns()).toEqual(without);
      // the pattern itself is still there
      const [count] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM patterns', { type: QueryTypes.SELECT });
      expect(Number(count.n)).toBe(1);
    });
  });

  it('0021 adds the release columns and the community tables (nothing released for trials already there), and its down removes exactly those', async () => {
    await withScratchDatabase(async (sequelize) => {
      const at = migrations.findIndex((m) => m.name === '0021-release-and-community');
      expect(at).toBeGreaterThan(0);
      const migrator = createMigrator(sequelize);
      await migrator.up({ to: migrations[at - 1].name });
      await sequelize.query(
        "INSERT INTO studios (id, name, slug, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000011', 'Old Studio', 'old-studio', now(), now()); " +
          "INSERT INTO patterns (id, studio_id, name, category, fabric_kind, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000012', '00000000-0000-4000-8000-000000000011', 'Skirt', 'skirt', 'woven', now(), now()); " +
          "INSERT INTO trials (id, studio_id, pattern_id, slug, title, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000013', '00000000-0000-4000-8000-000000000011', '00000000-0000-4000-8000-000000000012', 'old-trial', 'Old trial', now(), now())",
      );
      const columns = async (table: string) =>
        (
          await sequelize.query<{ name: string }>(`SELECT column_name::text AS name FROM information_schema.columns WHERE table_name = '${table}' ORDER BY 1`, { type: QueryTypes.SELECT })
        ).map((r) => r.name);
      const before = { trials: await columns('trials'), enrollments: await columns('enrollments'), users: await columns('users'), tables: await tables(sequelize) };

      await migrator.up({ to: '0021-release-and-community' });
      expect(await columns('trials')).toEqual(
        [...before.trials, 'released_at', 'released_by_id', 'final_draft_id', 'coverage_gap_note', 'release_open_items', 'copied_from_id', 'photos_removed_at'].sort(),
      );
      expect(await columns('enrollments')).toEqual([...before.enrollments, 'excused_at', 'excuse_note'].sort());
      expect(await columns('users')).toEqual([...before.users, 'deleted_at'].sort());
      expect(await tables(sequelize)).toEqual([...before.tables, 'announcement_recipients', 'announcements', 'calendar_feeds', 'pool_invitations', 'reward_codes'].sort());
      const [old] = await sequelize.query<{ released_at: Date | null }>('SELECT released_at FROM trials', { type: QueryTypes.SELECT });
      expect(old.released_at).toBeNull();
      // One code per finisher is the database's own rule.
      await sequelize.query("INSERT INTO reward_codes (id, trial_id, code, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000021', '00000000-0000-4000-8000-000000000013', 'A', now(), now())");
      await expect(
        sequelize.query("INSERT INTO reward_codes (id, trial_id, code, created_at, updated_at) VALUES ('00000000-0000-4000-8000-000000000022', '00000000-0000-4000-8000-000000000013', 'A', now(), now())"),
      ).rejects.toMatchObject({ name: 'SequelizeUniqueConstraintError', parent: { constraint: 'reward_codes_trial_code' } });

      await migrator.down({ to: '0021-release-and-community' });
      expect({ trials: await columns('trials'), enrollments: await columns('enrollments'), users: await columns('users'), tables: await tables(sequelize) }).toEqual(before);
      const [count] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM trials', { type: QueryTypes.SELECT });
      expect(Number(count.n)).toBe(1);
    });
  });

  it('when two processes migrate at once, each migration runs exactly once', async () => {
    await withScratchDatabase(async (sequelize) => {
      const other = createSequelize(urlOf(sequelize));
      try {
        const [a, b] = await Promise.all([migrateUp(sequelize), migrateUp(other)]);
        expect([...a, ...b].sort()).toEqual(migrations.map((m) => m.name).sort());
      } finally {
        await other.close();
      }
    });
  });

  it('report versions: down removes the version and prefilled columns of reports, up adds them back', async () => {
    await withScratchDatabase(async (sequelize) => {
      await migrateUp(sequelize);
      const columns = async () =>
        (
          await sequelize.query<{ name: string }>("SELECT column_name::text AS name FROM information_schema.columns WHERE table_name = 'reports' ORDER BY 1", { type: QueryTypes.SELECT })
        ).map((r) => r.name);
      expect(await columns()).toEqual(expect.arrayContaining(['version', 'prefilled']));
      await createMigrator(sequelize).down({ to: '0011-report-saves' });
      expect(await columns()).not.toContain('version');
      expect(await columns()).not.toContain('prefilled');
      await migrateUp(sequelize);
      expect(await columns()).toEqual(expect.arrayContaining(['version', 'prefilled']));
    });
  });

  it('the demo studio loads twice without duplicating anything', async () => {
    await withScratchDatabase(async (sequelize) => {
      await migrateUp(sequelize);
      await seedDemoStudio(sequelize, 4);
      await seedDemoStudio(sequelize, 4);
      const [counts] = await sequelize.query<{ users: string; studios: string; memberships: string; patterns: string; sizes: string; applications: string }>(
        'SELECT (SELECT count(*) FROM users) AS users, (SELECT count(*) FROM studios) AS studios, (SELECT count(*) FROM memberships) AS memberships, ' +
          '(SELECT count(*) FROM patterns) AS patterns, (SELECT count(*) FROM pattern_sizes) AS sizes, (SELECT count(*) FROM applications) AS applications',
        { type: QueryTypes.SELECT },
      );
      expect(Number(counts.users)).toBe(DEMO_ACCOUNTS.length + 40); // and forty invented applicants
      expect(Number(counts.studios)).toBe(1);
      expect(Number(counts.memberships)).toBeGreaterThanOrEqual(DEMO_ACCOUNTS.length);
      // The trousers and the earlier, released top, each in sizes 0–20.
      expect(Number(counts.patterns)).toBe(2);
      expect(Number(counts.sizes)).toBe(22);
      // Forty for the trousers, twenty-two for the top (returning testers: no new accounts).
      expect(Number(counts.applications)).toBe(62);
    });
  });
});

function urlOf(sequelize: Sequelize): string {
  const c = sequelize.config;
  return `postgres://${c.username}:${c.password}@${c.host}:${c.port}/${c.database}`;
}
