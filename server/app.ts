import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Db } from './db/knex';
import { systemClock, type Clock } from './lib/clock';
import type { Mailer } from './mail/mailer';
import type { MailInbox } from './mail/fake-smtp';
import { createPassport, passportMiddleware } from './middleware/auth';
import { csrfProtection } from './middleware/csrf';
import { apiAnswersAsAttachments } from './middleware/api-disposition';
import { bearerAuth } from './middleware/bearer';
import { errorHandler, notFoundHandler } from './middleware/error-handler';
import { sessionLimits, sessionMiddleware } from './middleware/session';
import { defaultSessionLimits, type SessionLimits } from './modules/auth/sessions.service';
import { apiRoutes, mountRoutes } from './routes';
import { createServices, DEFAULT_PUBLIC_URL } from './services';
import { createLoginThrottle, defaultThrottleRules, type ThrottleRules } from './modules/auth/login-throttle';
import type { UploadJobs } from './modules/uploads/upload-jobs';
import { createSecurityLog, useSecurityLog } from './lib/security-log';
import type { DestinationStream } from 'pino';

export interface AppOptions {
  db: Db;
  mailer?: Mailer;
  clock?: Clock;
  sessionSecret: string;
  secureCookies?: boolean;
  /** Built client to serve (dist/); omitted in API tests. */
  clientDir?: string;
  /** Failed sign-ins before delays start, and the delays (server/modules/auth/login-throttle.ts). */
  loginThrottle?: Partial<ThrottleRules>;
  /** The address people open Starledger at, for links in mail (PUBLIC_URL). */
  publicUrl?: string;
  /** The local mail fake's inbox, shown to the site admin; absent when mail goes to a real SMTP server. */
  mailInbox?: MailInbox;
  sessionCleanupIntervalMs?: number;
  /** Which proxies' X-Forwarded-Proto and X-Forwarded-For to believe, in Express's `trust proxy` terms (TRUST_PROXY); loopback by default. */
  trustProxy?: string | number | boolean;
  /** Where uploads are read and committed; see server/modules/uploads/upload-jobs.ts. */
  uploadJobs?: UploadJobs;
  /** Hours from sign-in and idle minutes after which a session ends (SESSION_MAX_HOURS, SESSION_IDLE_MINUTES); 12 and 30 by default. */
  sessionLimits?: Partial<SessionLimits>;
  /** The secret password hashes are made with besides their salts (PASSWORD_PEPPER, server/config.ts); none when omitted. */
  passwordPepper?: string;
  /** Whether site-admin routes need a session that passed the second factor (ADMIN_SECOND_FACTOR); `required` when omitted. */
  adminSecondFactor?: 'required' | 'optional';
  /** The key one-time password secrets are encrypted with (SECOND_FACTOR_KEY); a random one for this app when omitted (tests). */
  secondFactorKey?: string;
  /** Megabytes of uploaded files one person may have stored over every project (UPLOAD_QUOTA_MB); no limit when omitted. */
  uploadQuotaMb?: number;
  /** How many uploaded files one person may have stored over every project (UPLOAD_QUOTA_FILES); no limit when omitted. */
  uploadQuotaFiles?: number;
  /** Where the security log's JSON lines go (server/lib/security-log.ts); standard output when omitted. */
  logDestination?: DestinationStream;
}

export function createApp(options: AppOptions): Express {
  const { db } = options;
  const clock = options.clock ?? systemClock;
  const limits = { ...defaultSessionLimits, ...options.sessionLimits };
  const services = createServices(db, clock, { publicUrl: options.publicUrl, mailInbox: options.mailInbox, uploadJobs: options.uploadJobs, sessionLimits: limits, passwordPepper: options.passwordPepper, secondFactorKey: options.secondFactorKey, uploadQuotaMb: options.uploadQuotaMb, uploadQuotaFiles: options.uploadQuotaFiles });
  const passport = createPassport(services.users);

  const app = express();
  app.disable('x-powered-by');
  useSecurityLog(app, createSecurityLog({ destination: options.logDestination, clock }));
  // Read by the access gate for site-admin routes (server/middleware/access.ts).
  app.locals.adminSecondFactor = options.adminSecondFactor ?? 'required';
  // req.secure (and so HSTS) and req.ip (and so the sign-in throttle) follow X-Forwarded-Proto and -For only from these proxies.
  app.set('trust proxy', options.trustProxy ?? 'loopback');
  // Text assets and JSON compressed, brotli or gzip by what the client accepts (compression ≥ 1.8 speaks both).
  app.use(compression());
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Served over plain HTTP on an observatory's LAN as often as over
          // HTTPS; upgrading would break the former.
          upgradeInsecureRequests: null,
        },
      },
      // Set below, and only over HTTPS: sent over plain HTTP it is ignored at
      // best, and a LAN server that later gains HTTPS on another name would
      // be pinned by a header it never meant.
      strictTransportSecurity: false,
    }),
  );
  app.use((req, res, next) => {
    if (req.secure) res.set('Strict-Transport-Security', 'max-age=31536000; includeSubDomains');
    next();
  });

  const loginThrottle = createLoginThrottle(db, clock, { ...defaultThrottleRules, ...options.loginThrottle }, options.publicUrl ?? DEFAULT_PUBLIC_URL);

  const api = express.Router();
  // API answers are one person's view of live data: no browser or proxy keeps them.
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  // Each answer is a file to save, should a browser ever open one as a page (ASVS 14.4.2); downloads name their own.
  api.use(apiAnswersAsAttachments);
  api.use(express.json({ limit: '1mb' }));
  api.use(
    sessionMiddleware(db, {
      secret: options.sessionSecret,
      secureCookies: options.secureCookies ?? false,
      cleanupIntervalMs: options.sessionCleanupIntervalMs ?? 60 * 60 * 1000,
      maxHours: limits.maxHours,
    }),
  );
  api.use(...passportMiddleware(passport));
  api.use(sessionLimits(services.sessions));
  api.use(bearerAuth(services.tokens));
  api.use(csrfProtection);
  api.use(mountRoutes(db, apiRoutes(services, passport, loginThrottle)));
  api.use(notFoundHandler);
  api.use(errorHandler);
  app.use('/api', api);

  if (options.clientDir && fs.existsSync(path.join(options.clientDir, 'index.html'))) {
    const clientDir = options.clientDir;
    // Vite names every built asset after its content hash, so a name never changes content: cache it for a year.
    app.use('/assets', express.static(path.join(clientDir, 'assets'), { index: false, immutable: true, maxAge: '365d', fallthrough: false }));
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // The page itself names the current assets, so it is always asked for afresh.
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }));
  }
  app.use(errorHandler);
  return app;
}
