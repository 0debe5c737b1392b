import type { NextFunction, Request, Response } from 'express';
import { csrfSync } from 'csrf-sync';

/**
 * Synchroniser-token CSRF protection for cookie sessions: the token lives in
 * the session and comes back in the X-CSRF-Token header. Sign-in is exempt
 * (there is no session to protect yet, and the session id is regenerated at
 * sign-in), as are requests authenticated by a bearer token, which a browser
 * never attaches on its own.
 */
const { csrfSynchronisedProtection, generateToken } = csrfSync({
  getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
});

export { generateToken as csrfToken };

const EXEMPT = new Set(['/api/auth/login']);

export function csrfProtection(req: Request, res: Response, next: NextFunction) {
  // Without a signed-in user there is nothing to forge; the route's own
  // access check answers 401.
  if (!req.user || EXEMPT.has(req.baseUrl + req.path) || req.headers.authorization?.startsWith('Bearer ')) return next();
  return csrfSynchronisedProtection(req, res, next);
}
