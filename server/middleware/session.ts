import type { RequestHandler } from 'express';
import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import knex from 'knex';
import type { Db } from '../db/knex';

/**
 * connect-session-knex 5 calls the callback and then re-throws, so a
 * database error would surface as an unhandled rejection and stop Node.
 * Each method here reports through the callback only.
 */
class SafeKnexStore extends ConnectSessionKnexStore {
  /** Where touches go: a connection of their own that never waits for a lock (file databases), else the app's. */
  private toucher: ConnectSessionKnexStore | null = null;
  private touchedAt = new Map<string, number>();

  constructor(options: ConstructorParameters<typeof ConnectSessionKnexStore>[0] & { knex: Db }) {
    super(options);
    const touchDb = noWaitConnection(options.knex);
    if (touchDb) this.toucher = new ConnectSessionKnexStore({ ...options, knex: touchDb, cleanupInterval: 0 });
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
   * once a minute here, on a connection that does not wait: a touch that
   * meets the lock is skipped, and the next one (the expiry is 14 days away)
   * moves it.
   */
  override touch(sid: string, sess: Parameters<ConnectSessionKnexStore['touch']>[1], cb?: () => void) {
    const now = Date.now();
    if ((this.touchedAt.get(sid) ?? 0) > now - TOUCH_EVERY_MS) {
      cb?.();
      return Promise.resolve();
    }
    if (this.touchedAt.size > 10_000) this.touchedAt.clear();
    this.touchedAt.set(sid, now);
    return (this.toucher ? this.toucher.touch(sid, sess, cb) : super.touch(sid, sess, cb)).catch(() => cb?.());
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

/** A second connection to the app's SQLite file that fails at once instead of waiting for a lock; none for other databases. */
function noWaitConnection(db: Db): Db | null {
  const config = db.client.config as { client?: string; connection?: { filename?: string } };
  const filename = config.connection?.filename;
  if (config.client !== 'better-sqlite3' || !filename || filename.includes(':memory:')) return null;
  return knex({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    compileSqlOnError: false,
    pool: {
      min: 0,
      max: 1,
      afterCreate(conn: { pragma(sql: string): unknown }, done: (err: Error | null, conn: unknown) => void) {
        conn.pragma('busy_timeout = 0');
        done(null, conn);
      },
    },
  });
}

export interface SessionOptions {
  secret: string;
  secureCookies: boolean;
  cleanupIntervalMs: number;
}

export function sessionMiddleware(db: Db, options: SessionOptions): RequestHandler {
  return session({
    name: 'starledger.sid',
    secret: options.secret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    store: new SafeKnexStore({ knex: db, tableName: 'sessions', createTable: false, cleanupInterval: options.cleanupIntervalMs }),
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: options.secureCookies,
      maxAge: 1000 * 60 * 60 * 24 * 14,
    },
  });
}
