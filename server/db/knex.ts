import fs from 'node:fs';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import { migrationSource } from '../../migrations';

export type Db = Knex;

/** `file:` or a bare path means SQLite (the embedded default); anything else is handed to knex as a PostgreSQL URL. */
export function resolveDatabaseUrl(url = process.env.DATABASE_URL): string {
  return url && url.trim() !== '' ? url : 'file:data/starledger.sqlite';
}

export function createDb(url = resolveDatabaseUrl()): Db {
  if (url.startsWith('postgres://') || url.startsWith('postgresql://')) {
    return knex({ client: 'pg', connection: url, compileSqlOnError: false, migrations: { migrationSource } });
  }
  const filename = url.replace(/^file:/, '');
  if (filename !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(filename)), { recursive: true });
  return knex({
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    // A failed query's message then carries its SQL with placeholders, not the values bound to it (an upload's bytes, a password hash).
    compileSqlOnError: false,
    // One connection: SQLite serialises writers anyway, and a single
    // connection keeps an in-memory test database alive for the whole test.
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: { pragma(sql: string): unknown }, done: (err: Error | null, conn: unknown) => void) {
        conn.pragma('journal_mode = WAL');
        conn.pragma('foreign_keys = ON');
        conn.pragma('busy_timeout = 5000');
        done(null, conn);
      },
    },
    migrations: { migrationSource },
  });
}

export async function migrateLatest(db: Db): Promise<void> {
  await db.migrate.latest({ migrationSource });
}
