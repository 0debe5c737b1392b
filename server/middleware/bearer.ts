import type { NextFunction, Request, Response } from 'express';
import { AppError } from '../lib/errors';
import type { TokensService } from '../modules/tokens/tokens.service';

/**
 * `Authorization: Bearer <token>` acts as the token's owner with the owner's
 * roles, without a session. A wrong, revoked or expired token is a 401, not a quiet
 * fall-back to anonymous; an expired one says so (`token_expired`).
 */
export function bearerAuth(tokens: TokensService) {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.headers.authorization;
    if (!header?.startsWith('Bearer ')) return next();
    const found = await tokens.userFor(header.slice('Bearer '.length).trim());
    if (!found) throw new AppError(401, 'unauthenticated', 'That API token is not valid or has been revoked.');
    if ('expired' in found) {
      const when = found.expired ? ` on ${found.expired.slice(0, 10)}` : '';
      throw new AppError(401, 'token_expired', `That API token expired${when}. Make a new one on your account’s API tokens page and give it to the program that sent this.`);
    }
    req.user = found;
    next();
  };
}
