import passport from 'passport';
import type { Request } from 'express';
import { findUserById, toSessionUser } from '../users/users-repository';
import type { SessionUser } from '../../shared/session-types';
import { userReadWithSession } from './session-store';

// Credentials are checked by the sign-in service (throttled, hashed off the main thread); passport
// keeps the signed-in user in the session.
export function configurePassport(): passport.PassportStatic {
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser<string, Request>((req, id, done) => {
    // Read fresh on every request (a role change applies at once, a deactivated user is out):
    // with the session itself when the store read both, else on its own.
    const read = userReadWithSession(req);
    if (read !== undefined && (read === null || read.id === id)) {
      return done(null, read && read.active ? toSessionUser(read) : false);
    }
    findUserById(id)
      .then((row) => done(null, row && row.active ? toSessionUser(row) : false))
      .catch(done);
  });
  return passport;
}
