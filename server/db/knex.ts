import fs from 'node:fs';
import path from 'node:path';
import type { Database } from 'better-sqlite3';
import knex, { type Knex } from 'knex';
import { createRequire } from 'node:module';
import { migrationSource } from '../../migrations';

type SqliteClientClass = new (config: Knex.Config) => Knex.Client & { _query(connection: Database, obj: { sql: string }): Promise<unknown> };
const BetterSqliteClient = createRequire(import.meta.url)('knex/lib/dialects/better-sqlite3/index.js') as SqliteClientClass;

/**
 * knex's better-sqlite3 client, with one change: a ROLLBACK after SQLite
 * has already rolled the transaction back by itself is a no-op. SQLite does
 * so on SQLITE_FULL, SQLITE_IOERR, SQLITE_NOMEM and some SQLITE_BUSY; knex
 * then sends ROLLBACK anyway, gets "cannot rollback - no transaction is
 * active" and rejects with that, hiding the cause (a full disk answered as
 * a generic 500 instead of 507).
 */
class SqliteClient extends BetterSqliteClient {
  override async _query(connection: Database, obj: { sql: string; response?: unknown }) {
    if (/^ROLLBACK\b/i.test(obj.sql) && !connection.inTransaction) {
      obj.response = { changes: 0 };
      return obj;
    }
    return super._query(connection, obj);
  }
}

export type Db = Knex;

type TypeParser = (text: string) => unknown;
const pgBuiltinTypes = createRequire(import.meta.url)('pg').types as { getTypeParser(oid: number, format?: string): TypeParser };

/**
 * What PostgreSQL hands back, made the same as what SQLite hands back, so
 * that repositories (and tests reading rows) see one shape on either engine:
 * - bigint (int8: count(*), sum() of integers, bigserial ids) comes from pg
 *   as a string, for fear of numbers past 2^53; here it is a number, and a
 *   value past 2^53 is an error rather than silently rounded;
 * - numeric (avg(), sum() of bigints) likewise a number;
 * - timestamptz comes from pg as a Date; here it is the ISO 8601 string
 *   (UTC, milliseconds, "Z") that Starledger writes and SQLite returns.
 * Booleans are left as they come (true/false; SQLite's 0/1): rows are read
 * through Boolean().
 */
const pgTypes = {
  getTypeParser(oid: number, format?: string): TypeParser {
    if (format === 'binary') return pgBuiltinTypes.getTypeParser(oid, format);
    if (oid === PG_INT8) return safeInteger;
    if (oid === PG_NUMERIC) return Number;
    if (oid === PG_TIMESTAMPTZ) {
      const toDate = pgBuiltinTypes.getTypeParser(oid);
      return (text) => (toDate(text) as Date).toISOString();
    }
    return pgBuiltinTypes.getTypeParser(oid, format);
  },
};
const PG_INT8 = 20;
const PG_NUMERIC = 1700;
const PG_TIMESTAMPTZ = 1184;

function safeInteger(text: string): number {
  const n = Number(text);
  if (!Number.isSafeInteger(n)) throw new RangeError(`The database returned the integer ${text}, past what JavaScript holds exactly (2^53).`);
  return n;
}

/** `file:` or a bare path means SQLite (the embedded default); anything else is handed to knex as a PostgreSQL URL. */
export function resolveDatabaseUrl(url = process.env.DATABASE_URL): string {
  return url && url.trim() !== '' ? url : 'file:data/starledger.sqlite';
}

export interface DbOptions {
  /** Open the SQLite file read-only (a check of start-up diagnostics; the app itself needs to write). */
  readonly?: boolean;
}

export function createDb(url = resolveDatabaseUrl(), options: DbOptions = {}): Db {
  if (url.startsWith('postgres://') || url.startsWith('postgresql://')) {
    return knex({ client: 'pg', connection: { connectionString: url, types: pgTypes }, compileSqlOnError: false, migrations: { migrationSource } });
  }
  const filename = url.replace(/^file:/, '');
  if (filename !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(filename)), { recursive: true });
  return knex({
    client: SqliteClient as unknown as typeof Knex.Client,
    connection: { filename, options: { readonly: options.readonly ?? false } },
    useNullAsDefault: true,
    // A failed query's message then carries its SQL with placeholders, not the values bound to it (an upload's bytes, a password hash).
    compileSqlOnError: false,
    // One connection: SQLite serialises writers anyway, and a single
    // connection keeps an in-memory test database alive for the whole test.
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: Database, done: (err: Error | null, conn: unknown) => void) {
        try {
          // Switching to WAL writes the file (and makes -wal and -shm beside it): the first place a read-only database fails.
          conn.pragma('journal_mode = WAL');
          conn.pragma('foreign_keys = ON');
          conn.pragma('busy_timeout = 5000');
          // 64 MiB of page cache rather than SQLite's 2 MiB: the indexes of a 100 000-target project then stay in memory between requests.
          conn.pragma('cache_size = -65536');
        } catch (err) {
          return done(notWritable(conn, err), conn);
        }
        done(null, conn);
      },
    },
    migrations: { migrationSource },
  });
}

/** Whether the database is the embedded SQLite (through better-sqlite3) rather than PostgreSQL. */
export function isSqlite(db: Db): boolean {
  return (db.client as { driverName?: string }).driverName === 'better-sqlite3';
}

/** The database cannot be written; its message names the file and the real cause, for the operator at start-up. */
export class DatabaseNotWritableError extends Error {
  override name = 'DatabaseNotWritableError';
}

/**
 * Before migrating, one write that is rolled back straight away. Without it
 * a read-only database first fails inside knex's migration lock, whose
 * message ("Can't take lock to run migrations … knex migrate:unlock") sends
 * the operator after a lock that is not the problem.
 */
async function checkWritable(db: Db): Promise<void> {
  if (!isSqlite(db)) return;
  const connection: Database = await db.client.acquireConnection();
  try {
    connection.exec('BEGIN IMMEDIATE');
    connection.exec('CREATE TABLE starledger_write_check (x)');
  } catch (err) {
    throw notWritable(connection, err);
  } finally {
    if (connection.inTransaction) connection.exec('ROLLBACK');
    await db.client.releaseConnection(connection);
  }
}

/** A read-only or unopenable database as a DatabaseNotWritableError saying why; any other error as it is. */
function notWritable(connection: Database, err: unknown): Error {
  const code = (err as { code?: string }).code ?? '';
  const denied = code.startsWith('SQLITE_READONLY') || code.startsWith('SQLITE_CANTOPEN') || code === 'SQLITE_PERM';
  if (denied) return new DatabaseNotWritableError(whyNotWritable(connection, err as Error));
  return err instanceof Error ? err : new Error(String(err));
}

function whyNotWritable(connection: Database, err: Error): string {
  const file = connection.name;
  const head = `Starledger cannot write its database ${file}`;
  const tail = `(SQLite: ${err.message}). Starledger needs to write the file and to create ${path.basename(file)}-wal and -shm beside it; fix the permissions or point DATABASE_URL at a writable file.`;
  if (connection.readonly) return `${head}: it was opened read-only ${tail}`;
  const uid = process.getuid?.();
  for (const [what, target] of [['the file', file], ['its folder', path.dirname(file)]] as const) {
    try {
      fs.accessSync(target, fs.constants.W_OK);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EROFS') return `${head}: ${what} ${target} is on a read-only file system ${tail}`;
      const st = fs.statSync(target);
      return `${head}: ${what} ${target} is read-only for this process (mode ${(st.mode & 0o777).toString(8).padStart(4, '0')}, owner uid ${st.uid}; this process runs as uid ${uid}) ${tail}`;
    }
  }
  return `${head} ${tail}`;
}

/**
 * Runs `work` while no other Starledger process runs its own on the same
 * database. On PostgreSQL, several app processes may start at once on one
 * empty database: each waits for a session advisory lock held on one
 * connection of its pool (PostgreSQL frees it if the process dies), so they
 * migrate and seed one after another; knex's own migration lock would make
 * the second fail ("Migration table is already locked") instead of waiting.
 * A SQLite file has one app process, and the work just runs.
 */
export async function oneProcessAtATime<T>(db: Db, work: () => Promise<T>): Promise<T> {
  if (isSqlite(db)) return work();
  const connection = await db.client.acquireConnection();
  try {
    await db.raw('select pg_advisory_lock(?)', [START_UP_LOCK]).connection(connection);
    try {
      return await work();
    } finally {
      await db.raw('select pg_advisory_unlock(?)', [START_UP_LOCK]).connection(connection);
    }
  } finally {
    await db.client.releaseConnection(connection);
  }
}

/** The advisory lock's key: "STAR" in ASCII, a number nothing else on the database is expected to lock. */
const START_UP_LOCK = 0x53544152;

export async function migrateLatest(db: Db): Promise<void> {
  await checkWritable(db);
  await oneProcessAtATime(db, () => db.migrate.latest({ migrationSource }));
}

/** SQLITE_BUSY and SQLITE_LOCKED with their extended forms (SQLITE_BUSY_SNAPSHOT, …): another connection holds the lock. */
export function isBusyError(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return typeof code === 'string' && (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED'));
}

/**
 * One small write that may be skipped, such as a "last used" stamp: on
 * SQLite it is tried once without waiting for a lock held elsewhere (a
 * backup, a second process, an upload's commit) and skipped when the
 * database is busy. better-sqlite3 waits for a lock by blocking the whole
 * process for up to busy_timeout, so waiting here would stall every other
 * request. busy_timeout is 0 only for this statement: it is restored before
 * the connection goes back to the pool, and nothing else runs on the
 * connection in between (the calls are synchronous). Returns whether the
 * write happened.
 */
export async function writeUnlessBusy(db: Db, sql: string, bindings: (string | number | null)[]): Promise<boolean> {
  if (!isSqlite(db)) {
    await db.raw(sql, bindings);
    return true;
  }
  const connection: Database = await db.client.acquireConnection();
  try {
    const waited = connection.pragma('busy_timeout', { simple: true }) as number;
    connection.pragma('busy_timeout = 0');
    try {
      connection.prepare(sql).run(...bindings);
      return true;
    } catch (err) {
      if (isBusyError(err)) return false;
      throw err;
    } finally {
      connection.pragma(`busy_timeout = ${Number(waited)}`);
    }
  } finally {
    await db.client.releaseConnection(connection);
  }
}
