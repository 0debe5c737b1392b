import type { NextFunction, Request, Response } from 'express';
import { tooManyAttempts, validationFailed } from '../lib/errors';
import type { LoginThrottle } from '../modules/auth/login-throttle';
import type { SecondFactorService } from '../modules/second-factor/second-factor.service';
import type { UsersService } from '../modules/users/users.service';

/** What a confirmation asks for: the password or (second factor on) a code, or both. */
export type ConfirmationKind = 'passwordOrCode' | 'passwordAndCode';

/**
 * The one check of a sensitive change's re-authentication (ASVS 3.7.1,
 * 4.3.3): the request's own body carries `currentPassword` and/or `code`
 * (confirmationFields in shared/schemas/second-factor.ts), checked after
 * validation and before the handler. A wrong one is answered 400 naming the
 * field, and counted by the sign-in throttle like a failed sign-in, so that
 * a borrowed session cannot guess its way through; a code is taken once.
 */
export function confirmations(users: UsersService, secondFactor: SecondFactorService, throttle: LoginThrottle) {
  return (kind: ConfirmationKind) => async (req: Request, res: Response, next: NextFunction) => {
    const user = req.user!;
    const { currentPassword, code } = (res.locals.body ?? {}) as { currentPassword?: string; code?: string };
    const withCode = user.secondFactor && (kind === 'passwordAndCode' || (code ?? '') !== '');
    const withPassword = kind === 'passwordAndCode' || !withCode;
    const missing = [
      ...(withPassword && !currentPassword ? [{ path: 'currentPassword', message: user.secondFactor && kind === 'passwordOrCode' ? 'Confirm with your current password or a code from your authenticator app.' : 'Confirm with your current password.' }] : []),
      ...(kind === 'passwordAndCode' && !code ? [{ path: 'code', message: 'Confirm with a code from your authenticator app.' }] : []),
    ];
    if (missing.length > 0) throw validationFailed(missing);

    const wait = await throttle.waitSeconds(req, user.email);
    if (wait > 0) throw tooManyAttempts(res, wait, 'Too many wrong confirmations.');
    const wrong = [];
    if (withPassword && !(await users.authenticate(user.email, currentPassword!))) wrong.push({ path: 'currentPassword', message: 'This is not your current password.' });
    if (withCode && wrong.length === 0) {
      const checked = await secondFactor.check(user.id, code!, { recovery: kind === 'passwordAndCode' });
      if (checked !== 'ok') wrong.push({ path: 'code', message: checked === 'used' ? 'This code was used already; wait for the next one.' : 'This is not a current code of your authenticator app.' });
    }
    if (wrong.length > 0) {
      await throttle.failed(req, res, user.email);
      throw validationFailed(wrong);
    }
    await throttle.succeeded(req, user.email);
    next();
  };
}

export type Confirmations = ReturnType<typeof confirmations>;
