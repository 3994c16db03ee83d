import path from 'node:path';
import type { Knex } from 'knex';

export const MIGRATIONS_DIR = path.resolve(__dirname, '..', '..', 'migrations');
export const SEEDS_DIR = path.resolve(__dirname, '..', '..', 'seeds');

export const migrationConfig: Knex.MigratorConfig = {
  directory: MIGRATIONS_DIR,
  loadExtensions: ['.ts'],
  tableName: 'knex_migrations',
};

export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, done] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
  return done;
}

/** True when the demo may be seeded: no user exists yet, so we never seed over a shop's real data. */
export async function isEmptyDatabase(db: Knex): Promise<boolean> {
  const row = await db('users').count<{ count: number }[]>('* as count').first();
  return Number(row?.count ?? 0) === 0;
}

export async function seedDemo(db: Knex): Promise<boolean> {
  if (!(await isEmptyDatabase(db))) return false;
  await db.seed.run({ directory: SEEDS_DIR, loadExtensions: ['.ts'], sortDirsSeparately: false });
  return true;
}
