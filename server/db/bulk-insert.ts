import type { Db } from './knex';
import { chunks } from '../lib/chunks';

/**
 * Inserts many rows with multi-row `INSERT … VALUES (…), (…)` statements.
 * Knex builds a SQLite multi-row insert as a compound SELECT, which SQLite
 * caps at 500 terms and parses slowly; plain VALUES lists are standard SQL
 * (SQLite and PostgreSQL alike) and limited only by the bound-parameter
 * count, kept here under SQLite's 32 766.
 */
export async function bulkInsert(db: Db, table: string, rows: Record<string, unknown>[]): Promise<void> {
  if (rows.length === 0) return;
  const columns = Object.keys(rows[0]);
  const perStatement = Math.max(1, Math.floor(32_000 / columns.length));
  const head = `insert into ${db.client.wrapIdentifier(table)} (${columns.map((c) => db.client.wrapIdentifier(c)).join(', ')}) values `;
  const tuple = `(${columns.map(() => '?').join(', ')})`;
  for (const batch of chunks(rows, perStatement)) {
    const values: unknown[] = [];
    for (const row of batch) for (const c of columns) values.push(row[c] ?? null);
    await db.raw(head + batch.map(() => tuple).join(', '), values as never[]);
  }
}
