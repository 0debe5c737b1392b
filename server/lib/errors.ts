import type { Response } from 'express';
import { messageFor, type ErrorCode, type FieldIssue } from '../../shared/errors';
import { passwordChangeReasons, type PasswordChangeReason } from '../../shared/schemas/auth';

/** A failure the client should hear about: a stable code, an HTTP status, a message and optional details. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string = messageFor(code),
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what = 'Not found.') => new AppError(404, 'not_found', what);
export const forbidden = (message?: string) => new AppError(403, 'forbidden', message);
export const unauthenticated = () => new AppError(401, 'unauthenticated');
/** 403 for an account that must choose a new password before anything else (server/middleware/access.ts), saying why. */
export const passwordChangeRequired = (reason: PasswordChangeReason) =>
  new AppError(403, 'password_change_required', passwordChangeReasons[reason], { reason });
/**
 * 403 for a site admin whose session did not pass a second factor
 * (server/middleware/access.ts; ASVS 4.3.1): what to do, whether or not the
 * account has one.
 */
export const secondFactorRequired = (hasOne: boolean) =>
  new AppError(
    403,
    'second_factor_required',
    hasOne
      ? 'Site admin pages need a sign-in with your second factor. Sign out and sign in again with a code from your authenticator app.'
      : 'Site admin pages need a second factor. Turn it on under Account (Second factor), then come back.',
    { secondFactorOn: hasOne },
  );
/** 401 for a request whose session ran out (server/middleware/session.ts, sessionLimits), saying why. */
export const sessionEnded = (message: string) => new AppError(401, 'session_ended', message);
export const conflict = (message: string, details?: FieldIssue[]) => new AppError(409, 'conflict', message, details);
export const validationFailed = (details: FieldIssue[], message?: string) =>
  new AppError(400, 'validation_failed', message ?? describeIssues(details), details);

function describeIssues(details: FieldIssue[]): string {
  const first = details[0];
  if (!first) return messageFor('validation_failed');
  const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
  return `${first.path ? `${first.path}: ` : ''}${first.message}${more}`;
}

/** A wait in the unit people count it in, rounded up: "40 seconds", "2 minutes", "1 hour" (also for 3,599 seconds). */
export function waitWords(seconds: number): string {
  const minutes = Math.ceil(seconds / 60);
  const [n, unit] = seconds < 60 ? [seconds, 'second'] : minutes < 60 ? [minutes, 'minute'] : [Math.ceil(minutes / 60), 'hour'];
  return `${n} ${unit}${n === 1 ? '' : 's'}`;
}

/**
 * 429 with the seconds to wait: in Retry-After (RFC 9110 §10.2.3), in
 * `details.retryAfterSeconds` and in words after `what` ("Too many failed
 * sign-ins."), so that a form can say how long without knowing the header.
 */
export function tooManyAttempts(res: Response, seconds: number, what: string): AppError {
  res.set('Retry-After', String(seconds));
  return new AppError(429, 'rate_limited', `${what} Try again in ${waitWords(seconds)}.`, { retryAfterSeconds: seconds });
}
