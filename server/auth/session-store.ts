// The session store: connect-pg-simple's table and writes, with one change to reading. A request
// used to cost two look-ups before its route ran, the session by its id and then the signed-in
// user by the id in it; here one statement reads both, so the user is as fresh as before (role,
// name, unit and whether the account is active are read on every request, nothing is cached) and
// a sign-out, a deactivation or a password reset (which delete sessions) take effect at once.
import type { Request } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type pg from 'pg';
import type { UserRow } from '../users/users-repository';

/** The user columns a request needs: who it is, and whether the account may still sign in. */
export type SignedInRow = Pick<UserRow, 'id' | 'email' | 'name' | 'role' | 'unit' | 'active'>;

/** Carried on the session object from `get` to `createSession`; a symbol is never stored. */
const USER_ROW = Symbol('user read with the session');

type SessionWithUser = session.SessionData & { [USER_ROW]?: SignedInRow | null };

const usersOfRequests = new WeakMap<Request, SignedInRow | null>();

/**
 * The user this request's session names, as read together with the session: null when the
 * session names nobody who exists, undefined when the session was not read that way.
 */
export function userReadWithSession(req: Request): SignedInRow | null | undefined {
  return usersOfRequests.get(req);
}

// The session's user id is compared as uuid (so the users' primary key is used) only when it
// looks like one: a session written by anything else names nobody instead of failing the cast.
const READ = `SELECT s.sess, u.id, u.email, u.name, u.role, u.unit, u.active
  FROM sessions s
  LEFT JOIN users u ON u.id = CASE
    WHEN s.sess -> 'passport' ->> 'user' ~* '^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$'
    THEN (s.sess -> 'passport' ->> 'user')::uuid END
 WHERE s.sid = $1 AND s.expire >= to_timestamp($2)`;

type ReadRow = { sess: session.SessionData | string } & {
  [K in keyof SignedInRow]: SignedInRow[K] | null;
};

export function createSessionStore(
  pool: pg.Pool,
  options: { pruneSessionInterval: false | number },
): session.Store {
  const PgStore = connectPgSimple(session);

  class SessionAndUserStore extends PgStore {
    override get(sid: string, callback: (err: unknown, sess?: session.SessionData | null) => void) {
      // The same expiry test as connect-pg-simple's own read, in whole seconds.
      // A named statement: parsed and planned once per connection.
      const read = {
        name: 'sessions.read-with-user',
        text: READ,
        values: [sid, Math.ceil(Date.now() / 1000)],
      };
      pool.query<ReadRow>(read).then(
        ({ rows: [row] }) => {
          if (!row) return callback(null, null);
          let sess: SessionWithUser;
          try {
            sess = typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess;
          } catch {
            // A session that cannot be read is gone, as connect-pg-simple treats it.
            return this.destroy(sid, (err) => callback(err, null));
          }
          sess[USER_ROW] =
            row.id === null
              ? null
              : {
                  id: row.id,
                  email: row.email as string,
                  name: row.name as string,
                  role: row.role as SignedInRow['role'],
                  unit: row.unit as SignedInRow['unit'],
                  active: row.active as boolean,
                };
          callback(null, sess);
        },
        (err: unknown) => callback(err),
      );
    }

    override createSession(req: Request, sess: session.SessionData) {
      const withUser = sess as SessionWithUser;
      if (USER_ROW in withUser) {
        usersOfRequests.set(req, withUser[USER_ROW] ?? null);
        delete withUser[USER_ROW];
      }
      return super.createSession(req, sess);
    }
  }

  // connect-pg-simple arms its pruning timer on its first read, touch or write; with the read
  // replaced, the first touch of a session (every signed-in request touches) arms it.
  return new SessionAndUserStore({
    pool,
    tableName: 'sessions',
    createTableIfMissing: false,
    pruneSessionInterval: options.pruneSessionInterval,
  });
}
