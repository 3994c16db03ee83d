// The ordinary Knex command line, for the shop's database or the local demo cluster:
//   npm run knex -- migrate:status
//   npm run knex -- migrate:make add_something     (writes migrations/<timestamp>_add_something.ts)
// With DATABASE_URL set it uses that database; without, it starts the demo cluster as npm start does.
import type { Knex } from 'knex';
import { localDatabaseUrl } from './server/db/local-env';
import { migrationConfig, SEEDS_DIR } from './server/db/migrate';

export default async function config(): Promise<Knex.Config> {
  return {
    client: 'pg',
    connection: process.env.DATABASE_URL ?? (await localDatabaseUrl()),
    migrations: { ...migrationConfig, extension: 'ts' },
    seeds: { directory: SEEDS_DIR, loadExtensions: ['.ts'], extension: 'ts' },
  };
}
