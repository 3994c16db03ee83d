import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import bcrypt from 'bcryptjs';
import { BCRYPT_COST, verifyPassword } from './passwords';
import { findUserByEmail, findUserById, toSessionUser } from '../users/users-repository';
import type { SessionUser } from '../../shared/session-types';

// A fixed hash to compare against when the e-mail is unknown, so a wrong e-mail takes as long as a
// wrong password and the timing does not tell which accounts exist.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', BCRYPT_COST);

export function configurePassport(): passport.PassportStatic {
  passport.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      (email, password, done) => {
        void (async () => {
          const row = await findUserByEmail(email);
          const ok = await verifyPassword(password, row?.password_hash ?? DUMMY_HASH);
          if (!row || !ok || !row.active) return done(null, false);
          return done(null, toSessionUser(row));
        })().catch(done);
      },
    ),
  );
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((id: string, done) => {
    // Loaded fresh on every request: a role change applies at once, a deactivated user is out.
    findUserById(id)
      .then((row) => done(null, row && row.active ? toSessionUser(row) : false))
      .catch(done);
  });
  return passport;
}
