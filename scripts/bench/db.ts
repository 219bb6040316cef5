// A scratch database per benchmark run, migrated, dropped afterwards.
import { randomBytes } from 'node:crypto';
import { Client } from 'pg';
import { migrateUp } from '../../db/migrator';
import { createSequelize } from '../../db/sequelize';

export async function scratchDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const admin = process.env.DATABASE_URL!;
  const name = `basted_bench_${randomBytes(4).toString('hex')}`;
  const c = new Client({ connectionString: admin });
  await c.connect();
  await c.query(`CREATE DATABASE "${name}"`);
  await c.end();
  const url = new URL(admin);
  url.pathname = `/${name}`;
  const s = createSequelize(url.toString(), { registerModels: false, poolMax: 2 });
  await migrateUp(s);
  await s.close();
  return {
    url: url.toString(),
    async drop() {
      const d = new Client({ connectionString: admin });
      await d.connect();
      await d.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await d.end();
    },
  };
}
