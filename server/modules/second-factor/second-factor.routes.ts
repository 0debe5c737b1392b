import type { NextFunction, Request, Response } from 'express';
import type { User } from '../../../shared/schemas/auth';
import { confirmSecondFactorBody, signInCodeBody } from '../../../shared/schemas/second-factor';
import { AppError, tooManyAttempts, validationFailed } from '../../lib/errors';
import { parsed } from '../../middleware/validate';
import type { LoginThrottle } from '../auth/login-throttle';
import { sessionBody } from '../auth/auth.routes';
import type { UsersService } from '../users/users.service';
import type { SecondFactorService } from './second-factor.service';

export function secondFactorHandlers(secondFactor: SecondFactorService, users: UsersService, throttle: LoginThrottle) {
  const markPassed = (req: Request) => {
    req.session.secondFactorAt = secondFactor.stamp();
  };

  return {
    /**
     * The sign-in's first step for an account with the second factor on: the
     * password was right, but the session is not signed in; it only remembers
     * whose code it waits for. The account's failure count is not cleared
     * here, so that a known password does not reset the count of wrong codes.
     */
    askForCode(req: Request, res: Response, user: User): Promise<void> {
      req.session.secondFactorPending = { userId: user.id, email: user.email, at: secondFactor.stamp() };
      return new Promise((resolve, reject) =>
        req.session.save((err) => {
          if (err) return reject(err);
          res.json({ secondFactorRequired: true, message: 'Type the code your authenticator app shows, or one of your recovery codes.' });
          resolve();
        }),
      );
    },

    async status(req: Request, res: Response) {
      const user = req.user!;
      res.json({ on: user.secondFactor, recoveryCodesLeft: user.secondFactor ? await secondFactor.recoveryCodesLeft(user.id) : 0 });
    },

    async begin(req: Request, res: Response) {
      res.json(await secondFactor.begin(req.user!));
    },

    async confirm(req: Request, res: Response) {
      const { code } = parsed(res, 'body', confirmSecondFactorBody);
      const recoveryCodes = await secondFactor.confirm(req.user!.id, code);
      // This session has just shown a code of the new secret.
      markPassed(req);
      res.json({ recoveryCodes, message: 'The second factor is on. Keep these recovery codes somewhere safe: each signs you in once without your device, and they are not shown again.' });
    },

    async turnOff(req: Request, res: Response) {
      // The password and a code were checked by the route's confirmation (server/middleware/confirmation.ts).
      await secondFactor.turnOff(req.user!.id);
      delete req.session.secondFactorAt;
      res.json({ message: 'The second factor is off. Sign-in asks for your password only.' });
    },

    /**
     * The sign-in's code step: a current one-time code (taken once) or an
     * unused recovery code, counted by the sign-in throttle like a password.
     * Only then is the session signed in, as one that passed the second factor.
     */
    async signIn(req: Request, res: Response, next: NextFunction) {
      const { code } = parsed(res, 'body', signInCodeBody);
      const pending = req.session.secondFactorPending;
      if (!pending || !secondFactor.stillPending(pending.at)) {
        delete req.session.secondFactorPending;
        throw new AppError(401, 'unauthenticated', 'Sign in with your e-mail and password first; a password waits five minutes for its code.');
      }
      const wait = await throttle.waitSeconds(req, pending.email);
      if (wait > 0) throw tooManyAttempts(res, wait, 'Too many wrong codes.');
      const checked = await secondFactor.check(pending.userId, code, { recovery: true });
      if (checked !== 'ok') {
        await throttle.failed(req, res, pending.email);
        throw validationFailed([{ path: 'code', message: checked === 'used' ? 'This code was used already; wait for the next one.' : 'This is not a current code or an unused recovery code.' }]);
      }
      await throttle.succeeded(req, pending.email);
      const user = await users.findById(pending.userId);
      if (!user) throw new AppError(401, 'unauthenticated', 'Sign in with your e-mail and password first.');
      req.logIn(user, (err) => {
        if (err) return next(err);
        markPassed(req);
        sessionBody(req, users).then((body) => res.json(body), next);
      });
    },
  };
}
