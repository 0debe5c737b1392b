import type { RequestHandler } from 'express';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { UsersService } from '../modules/users/users.service';

/** What passport keeps in a session (`sess.passport.user`). */
export interface StoredSessionUser {
  id: number;
  stamp: string | undefined;
}

/**
 * One Passport instance per app (not the module-level singleton) so each
 * test's app has its own strategies and user lookup.
 */
export function createPassport(users: UsersService) {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      users.authenticate(email, password).then(
        (user) => done(null, user ?? false),
        (err) => done(err),
      );
    }),
  );
  // A session stores the account's id and the stamp of its password, so that a new password ends it.
  passport.serializeUser((user, done) => {
    users.sessionStampOf(user.id).then(
      (stamp) => done(null, { id: user.id, stamp } satisfies StoredSessionUser),
      (err) => done(err),
    );
  });
  passport.deserializeUser((stored: StoredSessionUser | number, done) => {
    // A bare id is a session from before stamps: it ends, and the person signs in again.
    const { id, stamp } = typeof stored === 'number' ? { id: stored, stamp: undefined } : stored;
    users.findForSession(id, stamp).then(
      // A deleted account, or one whose password changed, simply ends the session.
      (user) => done(null, user ?? false),
      (err) => done(err),
    );
  });
  return passport;
}

export type StarledgerPassport = ReturnType<typeof createPassport>;

export function passportMiddleware(passport: StarledgerPassport): RequestHandler[] {
  return [passport.initialize(), passport.session()];
}
