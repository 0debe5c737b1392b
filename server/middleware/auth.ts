import type { RequestHandler } from 'express';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { UsersService } from '../modules/users/users.service';

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
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: number, done) => {
    users.findById(id).then(
      // A deleted account simply ends the session.
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
