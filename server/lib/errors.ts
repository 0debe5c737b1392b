import { messageFor, type ErrorCode, type FieldIssue } from '../../shared/errors';

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
export const conflict = (message: string, details?: FieldIssue[]) => new AppError(409, 'conflict', message, details);
export const validationFailed = (details: FieldIssue[], message?: string) =>
  new AppError(400, 'validation_failed', message ?? describeIssues(details), details);

function describeIssues(details: FieldIssue[]): string {
  const first = details[0];
  if (!first) return messageFor('validation_failed');
  const more = details.length > 1 ? ` (and ${details.length - 1} more)` : '';
  return `${first.path ? `${first.path}: ` : ''}${first.message}${more}`;
}
