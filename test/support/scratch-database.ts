// A database of a test file's own on the test server, for what must not touch the shared one (a
// migration run down and up, figures over a shop with nothing else in it).
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { createDb, db } from '../../server/db/knex';

/**
 * Creates an empty database named `<prefix>_…` in a `beforeAll` and drops it in an `afterAll` this
 * registers (closing the shared connection too, as the file's last step); `.db` is its connection
 * once the file's tests run.
 */
export function scratchDatabase(prefix: string): { readonly db: Knex } {
  const name = `${prefix}_${randomUUID().slice(0, 8)}`;
  let scratch: Knex | null = null;
  beforeAll(async () => {
    await db.raw(`CREATE DATABASE ${name}`);
    const url = new URL(process.env.DATABASE_URL as string);
    url.pathname = `/${name}`;
    scratch = createDb(url.toString());
  });
  afterAll(async () => {
    await scratch?.destroy();
    await db.raw(`DROP DATABASE IF EXISTS ${name}`);
    await db.destroy();
  });
  return {
    get db(): Knex {
      if (!scratch) throw new Error(`the scratch database ${name} is not made yet`);
      return scratch;
    },
  };
}
