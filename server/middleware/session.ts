import type { RequestHandler } from 'express';
import session from 'express-session';
import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { Db } from '../db/knex';

/**
 * connect-session-knex 5 calls the callback and then re-throws, so a
 * database error would surface as an unhandled rejection and stop Node.
 * Each method here reports through the callback only.
 */
class SafeKnexStore extends ConnectSessionKnexStore {
  override get(sid: string, cb: Parameters<ConnectSessionKnexStore['get']>[1]) {
    return super.get(sid, cb).catch(() => null);
  }
  override set(sid: string, sess: Parameters<ConnectSessionKnexStore['set']>[1], cb?: (err?: unknown) => void) {
    return super.set(sid, sess, cb).catch(() => undefined);
  }
  override touch(sid: string, sess: Parameters<ConnectSessionKnexStore['touch']>[1], cb?: () => void) {
    return super.touch(sid, sess, cb).catch(() => undefined);
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
