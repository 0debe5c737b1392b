import type { NextFunction, Request, Response } from 'express';
import { AppError } from '../lib/errors';

/**
 * Refuses with 415 a request whose body is not of the one media type its
 * route reads, naming that type. A request without a body (neither
 * Content-Length nor Transfer-Encoding, or an empty one of no stated type)
 * passes: the body's validation then says what is missing.
 */
export function requireBodyType(mediaType: string) {
  return (req: Request, _res: Response, next: NextFunction) => {
    // An empty POST (Content-Length: 0, no Content-Type, as clients send a body-less POST) carries no body to be of a type.
    if (req.get('Content-Length') === '0' && !req.get('Content-Type')) return next();
    // req.is: null without a body, false when the body is of another type (type-is, as body-parser and multer use).
    if (req.is(mediaType) !== false) return next();
    const sent = req.get('Content-Type')?.split(';')[0]?.trim() || 'no Content-Type';
    next(new AppError(415, 'unsupported_media_type', `This request's body must be sent as ${mediaType}, not ${sent}.`));
  };
}
