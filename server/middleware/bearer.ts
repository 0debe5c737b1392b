import type { NextFunction, Request, Response } from 'express';
import { AppError } from '../lib/errors';
import type { TokensService } from '../modules/tokens/tokens.service';

/**
 * `Authorization: Bearer <token>` acts as the token's owner with the owner's
 * roles, without a session. A wrong or revoked token is a 401, not a quiet
 * fall-back to anonymous.
 */
export function bearerAuth(tokens: TokensService) {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.headers.authorization;
    if (!header?.startsWith('Bearer ')) return next();
    const user = await tokens.userFor(header.slice('Bearer '.length).trim());
    if (!user) throw new AppError(401, 'unauthenticated', 'That API token is not valid or has been revoked.');
    req.user = user;
    next();
  };
}
