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
      // How long a killed or vanished server process can keep its locks (a price-list commit holds
      // its supplier's lock): the database checks every 2 s during a statement whether the client
      // is still there (a killed process's socket is closed by the kernel at once); a host that
      // vanished without closing is noticed by TCP keepalive after about 25 s (10 s idle, then
      // three probes 5 s apart); and a transaction left idle is ended after 60 s in any case.
      keepAlive: true,
      keepAliveInitialDelayMillis: 10000,
      idle_in_transaction_session_timeout: 60000,
      options:
        '-c client_connection_check_interval=2000 -c tcp_keepalives_idle=10 -c tcp_keepalives_interval=5 -c tcp_keepalives_count=3',
    },
    // DB_POOL_SIZE connections per server process (README: "Settings"); a request that finds them
    // all busy waits up to 1.8 s for one, then answers 503 with Retry-After.
    pool: {
      min: 0,
      max: config.DB_POOL_SIZE,
      acquireTimeoutMillis: 1800,
      idleTimeoutMillis: 10000,
    },
    acquireConnectionTimeout: 1800,
  });
}

export const db = createDb();
