import type { Database, Statement } from 'better-sqlite3';
import { isSqlite, type Db } from './knex';
import { chunks } from '../lib/chunks';

/**
 * Inserts many rows in the caller's transaction.
 *
 * On SQLite inside a transaction the rows go through one prepared statement
 * on the transaction's own better-sqlite3 connection: the statement is
 * parsed once and each row costs only its binding, which is several times
 * faster than any multi-row statement (knex builds a SQLite multi-row insert
 * as a compound SELECT, capped at 500 terms and slow to parse). Elsewhere
 * (PostgreSQL, or outside a transaction) plain multi-row
 * `INSERT … VALUES (…), (…)`, standard SQL, within the bound-parameter limit.
 */
export async function bulkInsert(db: Db, table: string, rows: Record<string, unknown>[]): Promise<void> {
  if (rows.length === 0) return;
  const columns = Object.keys(rows[0]);
  const head = `insert into ${db.client.wrapIdentifier(table)} (${columns.map((c) => db.client.wrapIdentifier(c)).join(', ')}) values `;
  const tuple = `(${columns.map(() => '?').join(', ')})`;

  if (db.isTransaction && isSqlite(db)) {
    // knex hands a transaction's queries the one connection it holds.
    const connection: Database = await db.client.acquireConnection();
    const statement: Statement = connection.prepare(head + tuple);
    for (const row of rows) statement.run(columns.map((c) => toSqlite(row[c])));
    return;
  }

  const perStatement = Math.max(1, Math.floor(32_000 / columns.length));
  for (const batch of chunks(rows, perStatement)) {
    const values: unknown[] = [];
    for (const row of batch) for (const c of columns) values.push(row[c] ?? null);
    await db.raw(head + batch.map(() => tuple).join(', '), values as never[]);
  }
}

/** better-sqlite3 binds numbers, strings, bigints, buffers and null; booleans become 0/1 as knex would write them. */
function toSqlite(value: unknown): unknown {
  if (value === undefined) return null;
  if (typeof value === 'boolean') return value ? 1 : 0;
  return value;
}
