/**
 * Passport's local strategy over the user table: e-mail and password, the same failure for an
 * unknown account and a wrong password, with a dummy hash compared so both take the same time.
 */
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import { findSessionUser, findUserForSignIn, publicUser, sessionUser } from '../services/users.service';
import { DUMMY_HASH_PROMISE, verifyPassword } from './password';

export function configurePassport(dataSource: DataSource): passport.PassportStatic {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      (async () => {
        const user = await findUserForSignIn(dataSource, email);
        const ok = await verifyPassword(password, user?.passwordHash ?? (await DUMMY_HASH_PROMISE));
        return user && ok ? sessionUser(dataSource, publicUser(user)) : false;
      })().then((user) => done(null, user), done);
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((id: number, done) => {
    // A disabled account's sessions are ended when it is disabled; refusing here as well closes
    // the gap of a request already under way.
    findSessionUser(dataSource, id).then((user) => done(null, user && user.disabledAt === null ? user : false), done);
  });
  return instance;
}
