import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { messageFor } from '../../shared/errors';
import { AppError } from '../lib/errors';
import { isBusyError } from '../db/knex';
import { securityLogOf, type SecurityEvent } from '../lib/security-log';

/** Seconds a client is asked to wait after a busy database: a lock held elsewhere (a backup's step, a commit) lasts about that long. */
export const BUSY_RETRY_AFTER_S = 5;

/** Disk full: SQLite's SQLITE_FULL (also for a full temporary store), the file system's ENOSPC, PostgreSQL's disk_full. */
function isStorageFull(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return code === 'SQLITE_FULL' || code === 'ENOSPC' || code === '53100';
}

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  expose?: boolean;
}

/**
 * The one place that answers with `{ error: { code, message, details } }`.
 * Known failures keep their status; body-parser and multer errors are
 * translated, and every refusal is logged by name (server/lib/security-log.ts);
 * anything else is logged with its cause and answered as a
 * plain 500 without a trace, the log line and the answer sharing a random
 * reference so an operator can find the one from the other.
 */
export function errorHandler(err: unknown, req: Request, res: Response, next: NextFunction): void {
  if (res.headersSent) return next(err);
  const log = securityLogOf(req);
  if (err instanceof AppError) {
    log.event(req, res, eventOf(err), fieldsOf(err, res));
    res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
    return;
  }
  const e = (err ?? {}) as HttpishError;
  if (e.type === 'entity.parse.failed') {
    log.event(req, res, 'refused', { status: 400, code: 'malformed_json' });
    res.status(400).json({ error: { code: 'malformed_json', message: messageFor('malformed_json') } });
    return;
  }
  if (e.type === 'entity.too.large' || e.code === 'LIMIT_FILE_SIZE') {
    log.event(req, res, 'refused', { status: 413, code: 'payload_too_large' });
    res.status(413).json({ error: { code: 'payload_too_large', message: messageFor('payload_too_large') } });
    return;
  }
  if (e.code === 'EBADCSRFTOKEN') {
    log.event(req, res, 'csrf_failed', { status: 403, code: 'csrf_invalid' });
    res.status(403).json({ error: { code: 'csrf_invalid', message: messageFor('csrf_invalid') } });
    return;
  }
  // A lock held elsewhere is a moment's wait, not a fault: the client may retry.
  if (isBusyError(err)) {
    res.set('Retry-After', String(BUSY_RETRY_AFTER_S));
    res.status(503).json({ error: { code: 'database_busy', message: messageFor('database_busy') } });
    return;
  }
  if (isStorageFull(err)) {
    log.event(req, res, 'storage_full', { status: 507, error: describeForLog(err) });
    res.status(507).json({ error: { code: 'storage_full', message: messageFor('storage_full') } });
    return;
  }
  const status = e.status ?? e.statusCode;
  if (status && status >= 400 && status < 500) {
    log.event(req, res, 'refused', { status, code: 'bad_request' });
    res.status(status).json({ error: { code: 'bad_request', message: e.expose ? String((err as Error).message) : 'The request could not be processed.' } });
    return;
  }
  const reference = randomUUID();
  log.event(req, res, 'server_error', { status: 500, reference, error: describeForLog(err) });
  res.status(500).json({ error: { code: 'internal', message: `${messageFor('internal')} Reference: ${reference}.`, reference } });
}

/**
 * What the log keeps of an unexpected error: its kind, code and stack, never
 * the properties an error may carry along (a parser's `body`, a driver's
 * bound values), so no request body or file content reaches the log.
 */
export function describeForLog(err: unknown): string {
  if (!(err instanceof Error)) return `non-error thrown: ${typeof err}`;
  const code = (err as HttpishError).code;
  return `${code ? `${code} ` : ''}${err.stack ?? `${err.name}: ${err.message}`}`.slice(0, 4000);
}

/** The security log's name for a refusal (server/lib/security-log.ts). */
function eventOf(err: AppError): SecurityEvent {
  if (err.code === 'invalid_credentials') return 'sign_in_failed';
  if (err.code === 'rate_limited') return 'throttled';
  if (err.code === 'validation_failed') return 'validation_failed';
  if (err.status === 401) return 'unauthenticated';
  if (err.status === 403) return 'forbidden';
  return 'refused';
}

/** What the log keeps of a refusal: its status and code, the e-mail a sign-in was tried with, the paths (never the values) of invalid fields. */
function fieldsOf(err: AppError, res: Response): Record<string, unknown> {
  const fields: Record<string, unknown> = { status: err.status, code: err.code };
  if (err.code === 'invalid_credentials' && typeof res.locals.body?.email === 'string') fields.email = res.locals.body.email;
  if (err.code === 'validation_failed' && Array.isArray(err.details)) fields.fields = err.details.map((d: { path?: unknown }) => String(d.path ?? ''));
  return fields;
}

export function notFoundHandler(req: Request, res: Response): void {
  securityLogOf(req).event(req, res, 'route_unknown', { status: 404 });
  res.status(404).json({ error: { code: 'not_found', message: 'No such API route.' } });
}
