import type { CookieOptions, NextFunction, Request, RequestHandler, Response } from 'express';
import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import { writeUnlessBusy, type Db } from '../db/knex';
import type { SessionsService } from '../modules/auth/sessions.service';

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
  /**
   * The library's own upsert is SQLite's `insert or replace`, which would
   * blank the row's other columns (whose session it is, its sign-in and
   * last-use times: sessions.repository.ts) at every save; this one writes
   * only the session and its expiry, on SQLite and PostgreSQL alike.
   */
  override set(sid: string, sess: Parameters<ConnectSessionKnexStore['set']>[1], cb?: (err?: unknown) => void) {
    const expired = new Date(Date.now() + (sess.cookie.maxAge ?? 86_400_000)).toISOString();
    return this.app
      .knex('sessions')
      .insert({ sid, sess: JSON.stringify(sess), expired })
      .onConflict('sid')
      .merge(['sess', 'expired'])
      .then(
        () => cb?.(),
        (err: unknown) => cb?.(err),
      );
  }
  /**
   * Every signed-in request moves its session's expiry (rolling), which is a
   * write. A reader must not wait for one: while a long upload commit holds
   * SQLite's write lock, a waiting write would stop the whole request thread
   * (better-sqlite3 waits synchronously). So a session is touched at most
   * once a minute, and a touch that meets the lock is skipped; the next one
   * (the expiry is hours away) moves it. `touchedAt` only spares writes:
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
  /** The browser keeps the cookie this long from sign-in (SESSION_MAX_HOURS); the server ends the session by its own clock too (sessionLimits below). */
  maxHours: number;
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
    // The cookie is set at sign-in and not moved, so the browser too lets it go SESSION_MAX_HOURS after sign-in.
    rolling: false,
    store: new SafeKnexStore({ knex: db, tableName: 'sessions', createTable: false, cleanupInterval: options.cleanupIntervalMs }),
    cookie: { ...cookie.options, maxAge: options.maxHours * 3_600_000 },
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

type LogIn = (user: Express.User, options: { session?: boolean; keepSessionInfo?: boolean }, done: (err?: unknown) => void) => void;

/** The longest user agent kept with a session: enough for any real browser's, and no more of a made-up one. */
const USER_AGENT_MAX = 512;

/**
 * The time limits of a signed-in session (ASVS 3.3.2; the rule is in
 * sessions.service.ts), checked by the app's clock on every request that
 * comes with one. An ended session is removed and the request goes on
 * without a person, so a sign-in goes through while any route that needs
 * someone answers 401 `session_ended` with the reason (access.ts).
 *
 * Every sign-in, wherever it happens (the sign-in route, a password change,
 * an accepted invitation), goes through passport's req.logIn, which is
 * wrapped here so that the new session is marked with its owner, its time
 * and the browser and address it came from; a session never marked has
 * ended at its next request.
 */
export function sessionLimits(sessions: SessionsService): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    const logIn = req.logIn.bind(req) as LogIn;
    const wrapped = (user: Express.User, optionsOrDone: Parameters<LogIn>[1] | Parameters<LogIn>[2], maybeDone?: Parameters<LogIn>[2]) => {
      const options = typeof optionsOrDone === 'function' ? {} : optionsOrDone;
      const done = (typeof optionsOrDone === 'function' ? optionsOrDone : maybeDone)!;
      logIn(user, options, (err) => {
        if (err || options.session === false) return done(err);
        const userAgent = req.get('user-agent')?.slice(0, USER_AGENT_MAX) ?? null;
        sessions.recordSignIn(req.sessionID, { userId: user.id, userAgent, address: req.ip ?? null }).then(() => done(), done);
      });
    };
    req.logIn = req.login = wrapped as typeof req.logIn;

    if (!req.user || !req.session) return next();
    sessions.check(req.sessionID).then((ended) => {
      if (!ended) return next();
      req.session.regenerate((err) => {
        if (err) return next(err);
        req.user = undefined;
        res.locals.sessionEnded = ended;
        clearSessionCookie(res);
        next();
      });
    }, next);
  };
}
