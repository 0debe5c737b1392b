import type { CookieOptions, RequestHandler, Response } from 'express';
import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import { writeUnlessBusy, type Db } from '../db/knex';

/**
 * connect-session-knex 5 calls the callback and then re-throws, so a
 * database error would surface as an unhandled rejection and stop Node.
 * Each method here reports through the callback only.
 */
class SafeKnexStore extends ConnectSessionKnexStore {
  private touchedAt = new Map<string, number>();

  constructor(private readonly app: ConstructorParameters<typeof ConnectSessionKnexStore>[0] & { knex: Db }) {
    super(app);
  }

  override get(sid: string, cb: Parameters<ConnectSessionKnexStore['get']>[1]) {
    return super.get(sid, cb).catch(() => null);
  }
  override set(sid: string, sess: Parameters<ConnectSessionKnexStore['set']>[1], cb?: (err?: unknown) => void) {
    return super.set(sid, sess, cb).catch(() => undefined);
  }
  /**
   * Every signed-in request moves its session's expiry (rolling), which is a
   * write. A reader must not wait for one: while a long upload commit holds
   * SQLite's write lock, a waiting write would stop the whole request thread
   * (better-sqlite3 waits synchronously). So a session is touched at most
   * once a minute, and a touch that meets the lock is skipped; the next one
   * (the expiry is 14 days away) moves it. `touchedAt` only spares writes:
   * the session itself is read from the table on every request, so with
   * several processes each touches on its own minute and a session ended in
   * one (sign-out, a password change) is gone in all.
   */
  override touch(sid: string, sess: Parameters<ConnectSessionKnexStore['touch']>[1], cb?: () => void) {
    const now = Date.now();
    const expires = sess?.cookie?.expires;
    if (!expires || (this.touchedAt.get(sid) ?? 0) > now - TOUCH_EVERY_MS) {
      cb?.();
      return Promise.resolve();
    }
    if (this.touchedAt.size > 10_000) this.touchedAt.clear();
    this.touchedAt.set(sid, now);
    return writeUnlessBusy(this.app.knex, 'update sessions set expired = ? where sid = ?', [new Date(expires).toISOString(), sid])
      .catch(() => false)
      .then(() => cb?.());
  }
  override destroy(sid: string, cb?: (err?: unknown) => void) {
    return super.destroy(sid, cb).catch(() => 0);
  }
  override length(cb: Parameters<ConnectSessionKnexStore['length']>[0]) {
    return super.length(cb).catch(() => undefined);
  }
  override clear(cb?: (err?: unknown) => void) {
    return super.clear(cb).catch(() => 0);
  }
  override all(cb: Parameters<ConnectSessionKnexStore['all']>[0]) {
    return super.all(cb).catch(() => []);
  }
}

const TOUCH_EVERY_MS = 60_000;

export interface SessionOptions {
  secret: string;
  secureCookies: boolean;
  cleanupIntervalMs: number;
}

/**
 * The session cookie's name and attributes. With Secure it carries the
 * `__Host-` prefix (RFC 6265bis §4.1.3.2; ASVS 3.4.4): a browser then takes
 * it only if it is Secure, has Path=/ and names no Domain, so no other host
 * under the domain and no plain-HTTP answer can set or shadow it. Without
 * Secure (a LAN over plain HTTP) the prefix would make browsers drop it.
 */
export function sessionCookie(secure: boolean): { name: string; options: CookieOptions } {
  return { name: secure ? '__Host-starledger.sid' : 'starledger.sid', options: { path: '/', httpOnly: true, sameSite: 'lax', secure } };
}

export function sessionMiddleware(db: Db, options: SessionOptions): RequestHandler {
  const cookie = sessionCookie(options.secureCookies);
  const handler = session({
    name: cookie.name,
    secret: options.secret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    store: new SafeKnexStore({ knex: db, tableName: 'sessions', createTable: false, cleanupInterval: options.cleanupIntervalMs }),
    cookie: { ...cookie.options, maxAge: 1000 * 60 * 60 * 24 * 14 },
  });
  return (req, res, next) => {
    res.locals.sessionCookie = cookie;
    handler(req, res, next);
  };
}

/** Tells the browser to drop the session cookie, with the name and attributes it was set with (a `__Host-` cookie is only cleared by a Secure, Path=/ one). */
export function clearSessionCookie(res: Response): void {
  const cookie = res.locals.sessionCookie as ReturnType<typeof sessionCookie>;
  res.clearCookie(cookie.name, cookie.options);
}
