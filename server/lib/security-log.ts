import { randomUUID } from 'node:crypto';
import type { Express, NextFunction, Request, Response } from 'express';
import pino, { type DestinationStream } from 'pino';
import type { Clock } from './clock';

/**
 * The security log: one JSON object a line (pino), so that a CR or LF in an
 * e-mail, a path or an error message stays inside its JSON string and can
 * never start a forged line (ASVS 7.3.1). Each line carries `time` (the
 * app's clock, ISO 8601 UTC), `level`, `event` (one of the names below),
 * and for a request `requestId` (also sent back as X-Request-Id), `method`,
 * `path` (without the query string, where link tokens travel), `ip`
 * (req.ip, so X-Forwarded-For only from TRUST_PROXY's proxies) and
 * `userId` (null when nobody is signed in), then the event's own fields.
 *
 * Never logged: passwords, session ids, cookies, CSRF or API tokens, link
 * tokens, request bodies, file contents. Callers name the fields they add;
 * nothing copies a request or an error object wholesale (describeForLog in
 * error-handler.ts keeps an error's code and stack only).
 */
export const securityEvents = {
  /** A sign-in with the right password. Fields: email. */
  sign_in: 'info',
  /** A wrong e-mail or password. Fields: email (as typed). */
  sign_in_failed: 'warn',
  sign_out: 'info',
  /** A request refused with 429 while its account or address waits out a delay (sign-in, password reset). */
  throttled: 'warn',
  /** A delay began for an account or an address and the site admins were mailed. Fields: subject, failures, admins. */
  throttle_alert: 'warn',
  /** 401: not signed in, session ended, API token unknown or expired. Fields: status, code. */
  unauthenticated: 'warn',
  /** 403: not allowed, or a new password must be chosen first. Fields: status, code. */
  forbidden: 'warn',
  /** 403 for a write without the session's CSRF token. */
  csrf_failed: 'warn',
  /** 400 for input that failed its schema. Fields: fields (the paths, never the values). */
  validation_failed: 'info',
  /** Any other refusal of a request (404 for a record or a project one cannot see, 409, 413, malformed JSON). Fields: status, code. */
  refused: 'info',
  /** 404 for a path or method no API route has. */
  route_unknown: 'warn',
  /** A site admin read the list of accounts. Fields: accounts (how many). */
  accounts_read: 'info',
  /** An unexpected fault, answered 500 with `reference`. Fields: reference, error. */
  server_error: 'error',
  /** The disk or the database is full (507). Fields: error. */
  storage_full: 'error',
} as const;

export type SecurityEvent = keyof typeof securityEvents;

export interface SecurityLogOptions {
  /** Where lines go: standard output when omitted; tests pass a stream that keeps them. */
  destination?: DestinationStream;
  clock: Clock;
}

export function createSecurityLog(options: SecurityLogOptions) {
  const { clock } = options;
  const logger = pino(
    {
      base: undefined,
      timestamp: () => `,"time":"${clock.now().toISOString()}"`,
      formatters: { level: (label) => ({ level: label }) },
    },
    options.destination ?? pino.destination({ dest: 1, sync: false }),
  );

  return {
    /** One event of a request, with who, where from and which request. */
    event(req: Request, res: Response, event: SecurityEvent, fields: Record<string, unknown> = {}): void {
      logger[securityEvents[event]]({
        event,
        requestId: res.locals?.requestId ?? null,
        method: req.method,
        path: `${req.baseUrl ?? ''}${req.path ?? ''}`,
        ip: req.ip ?? null,
        userId: req.user?.id ?? null,
        ...fields,
      });
    },
  };
}

export type SecurityLog = ReturnType<typeof createSecurityLog>;

/** Makes `log` the app's security log and gives each request an id (res.locals.requestId, X-Request-Id). */
export function useSecurityLog(app: Express, log: SecurityLog): void {
  app.locals.securityLog = log;
  app.use((_req: Request, res: Response, next: NextFunction) => {
    const id = randomUUID();
    res.locals.requestId = id;
    res.set('X-Request-Id', id);
    next();
  });
}

/** The security log of the app serving `req` (set by useSecurityLog in server/app.ts). */
export function securityLogOf(req: Request): SecurityLog {
  const log = req.app?.locals?.securityLog as SecurityLog | undefined;
  if (!log) throw new Error('This app has no security log: createApp sets one with useSecurityLog.');
  return log;
}
