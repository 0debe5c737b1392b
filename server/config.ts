import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** Configuration from the environment, with the defaults `npm start` runs on. README lists them. */
export const config = {
  port: Number(process.env.PORT ?? 3000),
  host: process.env.HOST ?? '127.0.0.1',
  databaseUrl: process.env.DATABASE_URL,
  smtpUrl: process.env.SMTP_URL,
  /** Where people open Starledger, for the links in mail; behind a proxy, the proxy's address. */
  publicUrl: (process.env.PUBLIC_URL ?? process.env.APP_URL ?? `http://localhost:${Number(process.env.PORT ?? 3000)}`).replace(/\/+$/, ''),
  /** The outbox worker and the summary scheduler; MAIL_WORKER=false leaves them to another process on the same database. */
  mailWorker: process.env.MAIL_WORKER !== 'false',
  mailFrom: process.env.MAIL_FROM ?? 'Starledger <starledger@localhost>',
  secureCookies: process.env.COOKIE_SECURE === 'true',
  /** Proxies whose X-Forwarded-Proto says a request came over HTTPS (Express `trust proxy`: loopback, an address, a subnet, a hop count). */
  trustProxy: trustProxyOf(process.env.TRUST_PROXY ?? 'loopback'),
  /** The demo scenario and its accounts (whose passwords README publishes) into an empty database: only when asked for, as `npm start` and `npm run dev` do (ASVS 2.5.4, 14.2.2). */
  seedDemo: process.env.SEED_DEMO === 'true',
  dataDir: path.resolve(process.env.DATA_DIR ?? 'data'),
  clientDir: path.resolve(process.env.CLIENT_DIR ?? 'dist'),
  /** Hours a preview may wait for its commit before it is discarded (its file is kept). */
  previewMaxAgeHours: Number(process.env.PREVIEW_MAX_AGE_HOURS ?? 48),
  /** Megabytes of uploaded files one person may have stored, over every project (ASVS 12.1.3). */
  uploadQuotaMb: positiveNumber('UPLOAD_QUOTA_MB', 1024),
  /** Uploaded files one person may have stored, over every project (ASVS 12.1.3). */
  uploadQuotaFiles: positiveNumber('UPLOAD_QUOTA_FILES', 10_000),
  /** A signed-in session ends this many hours after sign-in, and after this many minutes without use (ASVS 3.3.2 level 2: at most 12 and 30). */
  sessionMaxHours: positiveNumber('SESSION_MAX_HOURS', 12),
  sessionIdleMinutes: positiveNumber('SESSION_IDLE_MINUTES', 30),
  /** Whether site-admin routes need a session that passed the second factor (ASVS 4.3.1): `required` unless ADMIN_SECOND_FACTOR=optional (the demo's `npm start`). */
  adminSecondFactor: adminSecondFactorOf(process.env.ADMIN_SECOND_FACTOR),
};

function adminSecondFactorOf(raw: string | undefined): 'required' | 'optional' {
  if (raw === undefined || raw.trim() === '' || raw === 'required') return 'required';
  if (raw === 'optional') return 'optional';
  throw new Error(`ADMIN_SECOND_FACTOR must be required or optional (it is "${raw}").`);
}

/** A setting that must be a number above zero; anything else stops the start with the setting's name. */
function positiveNumber(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw.trim() === '') return fallback;
  const n = Number(raw);
  if (!Number.isFinite(n) || n <= 0) throw new Error(`${name} must be a number above 0 (it is "${raw}").`);
  return n;
}

/** A hop count and true/false as Express reads them; anything else (loopback, addresses, subnets) as written. */
function trustProxyOf(value: string): string | number | boolean {
  if (/^\d+$/.test(value)) return Number(value);
  if (value === 'true' || value === 'false') return value === 'true';
  return value;
}

/**
 * SESSION_SECRET, or one made once and kept under data/ so sessions survive
 * a restart. Several processes sign each other's cookies only with one
 * secret: the same SESSION_SECRET, or one DATA_DIR.
 */
export function sessionSecret(): string {
  return process.env.SESSION_SECRET || secretKeptIn('session-secret');
}

/**
 * PASSWORD_PEPPER, or one made once and kept in DATA_DIR/password-pepper:
 * the secret every password hash is made with besides its salt
 * (server/lib/passwords.ts; ASVS 2.4.5). It is kept apart from the
 * database, and without it no password verifies: back it up apart from the
 * database, and give every process on one database the same one.
 */
export function passwordPepper(): string {
  return process.env.PASSWORD_PEPPER || secretKeptIn('password-pepper');
}

/**
 * SECOND_FACTOR_KEY, or one made once and kept in DATA_DIR/second-factor-key:
 * the key each account's one-time password secret is encrypted with
 * (server/modules/second-factor; ASVS 2.9.1), kept apart from the database as
 * the pepper is. Without it no code verifies; give every process the same one.
 */
export function secondFactorKey(): string {
  return process.env.SECOND_FACTOR_KEY || secretKeptIn('second-factor-key');
}

/**
 * A random secret made once and kept in a file under DATA_DIR. The file is
 * written whole under another name and linked into place, which fails if it
 * exists, so of processes starting at once on one folder the first one's
 * secret is the one every process reads.
 */
function secretKeptIn(name: string): string {
  const file = path.join(config.dataDir, name);
  if (!fs.existsSync(file)) {
    fs.mkdirSync(config.dataDir, { recursive: true });
    const draft = `${file}.${process.pid}`;
    fs.writeFileSync(draft, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
    try {
      fs.linkSync(draft, file);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    } finally {
      fs.rmSync(draft, { force: true });
    }
  }
  return fs.readFileSync(file, 'utf8').trim();
}
