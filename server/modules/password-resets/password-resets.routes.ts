import type { Request, Response } from 'express';
import { completePasswordResetBody, linkBody, passwordResetRequestBody } from '../../../shared/schemas/auth';
import { tooManyAttempts } from '../../lib/errors';
import { parsed } from '../../middleware/validate';
import type { PasswordResetsService } from './password-resets.service';
import { clearSessionCookie } from '../../middleware/session';

export function passwordResetsHandlers(resets: PasswordResetsService) {
  return {
    /** 202 with the same body whether or not an account has the address; 429 while the requesting address waits out its limit. */
    async request(req: Request, res: Response) {
      const { email } = parsed(res, 'body', passwordResetRequestBody);
      const from = req.ip ?? 'unknown';
      const wait = await resets.addressWaitSeconds(from);
      if (wait > 0) throw tooManyAttempts(res, wait, 'Too many requests for a reset link from this address.');
      res.status(202).json(await resets.request(email, from));
    },
    async lookup(_req: Request, res: Response) {
      res.json({ reset: await resets.lookup(parsed(res, 'body', linkBody).token) });
    },
    /** The account's sessions are gone from the store; this browser's session, if it was one of them, is dropped too. */
    async complete(req: Request, res: Response) {
      const { userId } = await resets.complete(parsed(res, 'body', completePasswordResetBody));
      if (req.user?.id === userId && req.session) {
        await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
        clearSessionCookie(res);
      }
      res.json({ message: 'Your new password is set. Sign in with it; every earlier session has ended.' });
    },
  };
}
