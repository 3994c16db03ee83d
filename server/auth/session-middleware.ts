// Sessions live in PostgreSQL (connect-pg-simple) so any number of server processes can serve one
// database. The cookie is HttpOnly and SameSite=Lax; it rolls on every request and expires after the
// idle timeout.
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import { config } from '../config';

export function sessionMiddleware(databaseUrl = config.databaseUrl) {
  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: 5,
    connectionTimeoutMillis: 1500,
  });
  // A dropped connection must not crash the process; the next query reconnects.
  pool.on('error', () => undefined);
  const store = new PgStore({
    pool,
    tableName: 'sessions',
    createTableIfMissing: false,
    pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
  });
  return {
    pool,
    store,
    middleware: session({
      name: 'stepstock.sid',
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      proxy: config.TRUST_PROXY === '1',
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: config.TRUST_PROXY === '1' ? 'auto' : false,
        maxAge: config.SESSION_IDLE_MINUTES * 60 * 1000,
      },
    }),
  };
}
