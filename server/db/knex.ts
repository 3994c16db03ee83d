// The one Knex instance (one pool) for the process. Queries time out rather than hang when the
// database is unreachable, so the API can answer 503 within two seconds.
import knexFactory, { Knex } from 'knex';
import pg from 'pg';
import { config } from '../config';

// bigint counts (COUNT(*), SUM over integers) come back as JS numbers; every value we sum fits.
pg.types.setTypeParser(20, (v: string) => Number(v));
// NUMERIC stays a string: money and decimals are handled with decimal.js, never binary floats.

export function createDb(url = config.databaseUrl): Knex {
  return knexFactory({
    client: 'pg',
    connection: {
      connectionString: url,
      connectionTimeoutMillis: 1500,
      statement_timeout: 15000,
      application_name: 'stepstock',
    },
    pool: { min: 0, max: 10, acquireTimeoutMillis: 1800, idleTimeoutMillis: 10000 },
    acquireConnectionTimeout: 1800,
  });
}

export const db = createDb();
