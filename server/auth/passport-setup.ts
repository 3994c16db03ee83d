import passport from 'passport';
import { findUserById, toSessionUser } from '../users/users-repository';
import type { SessionUser } from '../../shared/session-types';

// Credentials are checked by the sign-in service (throttled, hashed off the main thread); passport
// keeps the signed-in user in the session.
export function configurePassport(): passport.PassportStatic {
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((id: string, done) => {
    // Loaded fresh on every request: a role change applies at once, a deactivated user is out.
    findUserById(id)
      .then((row) => done(null, row && row.active ? toSessionUser(row) : false))
      .catch(done);
  });
  return passport;
}
