// Sessions live in PostgreSQL (connect-pg-simple's table, read with the signed-in user by
// session-store.ts) so any number of server processes can serve one database. The cookie is
// HttpOnly and SameSite=Lax; it rolls on every request and expires after the idle timeout.
import session from 'express-session';
import pg from 'pg';
import { config } from '../config';
import { createSessionStore } from './session-store';

export function sessionMiddleware(databaseUrl = config.databaseUrl) {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: 5,
    connectionTimeoutMillis: 1500,
  });
  // A dropped connection must not crash the process; the next query reconnects.
  pool.on('error', () => undefined);
  const store = createSessionStore(pool, {
    pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
  });
  throttleTouches(store);
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
        // Over Stepstock's own HTTPS always; behind a proxy whenever the proxy says it was HTTPS.
        secure: config.tls ? true : config.TRUST_PROXY === '1' ? 'auto' : false,
        maxAge: config.SESSION_IDLE_MINUTES * 60 * 1000,
      },
    }),
  };
}

/** Sessions are touched in the store at most this often; the idle timeout is counted in minutes. */
export const TOUCH_EVERY_MS = 60_000;

/**
 * A rolling session is written back on every request only to move its expiry: a write and a disk
 * flush per request, reads included. Once a minute per session is enough for an idle timeout of
 * minutes (the stored end may trail the cookie's by up to a minute, ending an idle session that
 * much sooner, never later). The map only saves writes: losing it (a restart, another process)
 * costs one extra touch, never a wrong answer.
 */
function throttleTouches(store: session.Store): void {
  const touch = store.touch?.bind(store);
  if (!touch) return;
  const lastTouch = new Map<string, number>();
  store.touch = (sid, sess, callback) => {
    const now = Date.now();
    const last = lastTouch.get(sid);
    if (last !== undefined && now - last < TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    if (lastTouch.size >= 10_000) {
      for (const [key, at] of lastTouch) if (now - at >= TOUCH_EVERY_MS) lastTouch.delete(key);
    }
    lastTouch.set(sid, now);
    // The typings name no error argument, but stores pass one when the write fails.
    const done = (err?: unknown) => {
      if (err) lastTouch.delete(sid);
      (callback as ((e?: unknown) => void) | undefined)?.(err);
    };
    touch(sid, sess, done as () => void);
  };
}
