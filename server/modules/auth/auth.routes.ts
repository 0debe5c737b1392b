import type { NextFunction, Request, Response } from 'express';
import type { User } from '../../../shared/schemas/auth';
import { AppError, tooManyAttempts, validationFailed } from '../../lib/errors';
import { csrfToken } from '../../middleware/csrf';
import type { StarledgerPassport } from '../../middleware/auth';
import type { UsersService } from '../users/users.service';
import { changePasswordBody, loginBody } from '../../../shared/schemas/auth';
import { parsed } from '../../middleware/validate';
import type { LoginThrottle } from './login-throttle';
import { clearSessionCookie } from '../../middleware/session';
import { securityLogOf } from '../../lib/security-log';

/** What the browser keeps of a session: the person, their roles and the CSRF token for writes. */
export async function sessionBody(req: Request, users: UsersService) {
  const user = req.user as User;
  return { user, memberships: await users.memberships(user.id), csrfToken: csrfToken(req) };
}

/** `askForCode`: the sign-in's answer for an account with the second factor on (second-factor.routes.ts), instead of a session. */
export function authHandlers(passport: StarledgerPassport, users: UsersService, throttle: LoginThrottle, askForCode: (req: Request, res: Response, user: User) => Promise<void>) {
  return {
    /**
     * While the account or the address waits out a delay (see
     * login-throttle.ts) the answer is 429 whatever the password, so that a
     * delay is no oracle; it is the same for an e-mail no account has.
     */
    async login(req: Request, res: Response, next: NextFunction) {
      const { email } = parsed(res, 'body', loginBody);
      const wait = await throttle.waitSeconds(req, email);
      if (wait > 0) return next(tooManyAttempts(res, wait, 'Too many failed sign-ins.'));
      passport.authenticate('local', (err: unknown, user: User | false) => {
        if (err) return next(err);
        // One message whether the e-mail is unknown or the password wrong.
        if (!user) return throttle.failed(req, res, email).then(() => next(new AppError(401, 'invalid_credentials')), next);
        if (user.secondFactor) return askForCode(req, res, user).catch(next);
        throttle.succeeded(req, email).then(
          () =>
            req.logIn(user, (loginErr) => {
              if (loginErr) return next(loginErr);
              securityLogOf(req).event(req, res, 'sign_in', { email });
              sessionBody(req, users).then((body) => res.json(body), next);
            }),
          next,
        );
      })(req, res, next);
    },

    /**
     * A signed-in person's new password. The current one is asked for and
     * counted by the sign-in throttle like a sign-in, so that a borrowed
     * session cannot guess it; the change ends every session of the account
     * and this browser gets a new one with the new password's stamp.
     */
    async changePassword(req: Request, res: Response, next: NextFunction) {
      const user = req.user as User;
      const body = parsed(res, 'body', changePasswordBody);
      const wait = await throttle.waitSeconds(req, user.email);
      if (wait > 0) throw tooManyAttempts(res, wait, 'Too many wrong passwords.');
      if (!(await users.authenticate(user.email, body.currentPassword))) {
        await throttle.failed(req, res, user.email);
        throw validationFailed([{ path: 'currentPassword', message: 'This is not your current password.' }]);
      }
      await throttle.succeeded(req, user.email);
      // A password someone else chose, or one now refused, cannot be kept by "changing" it to itself (ASVS 2.3.1).
      if (body.password === body.currentPassword) throw validationFailed([{ path: 'password', message: 'Choose a password other than your current one.' }]);
      await users.changePassword(user.id, body.password);
      // The new session keeps this one's second factor: the same person signed in with it.
      const secondFactorAt = req.session.secondFactorAt;
      req.logIn({ ...user, mustChangePassword: null }, (loginErr) => {
        if (loginErr) return next(loginErr);
        if (secondFactorAt) req.session.secondFactorAt = secondFactorAt;
        sessionBody(req, users).then((session) => res.json({ ...session, message: 'Your password is changed. Your other sessions have ended.' }), next);
      });
    },

    logout(req: Request, res: Response, next: NextFunction) {
      securityLogOf(req).event(req, res, 'sign_out');
      req.logout((err) => {
        if (err) return next(err);
        req.session.destroy(() => {
          clearSessionCookie(res);
          res.status(204).end();
        });
      });
    },

    async me(req: Request, res: Response) {
      res.json(await sessionBody(req, users));
    },
  };
}
