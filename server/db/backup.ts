import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';

/**
 * Online backup and restore of the SQLite database through SQLite's backup
 * API (better-sqlite3's `db.backup()`). A plain copy of the file misses what
 * is still in the -wal file and can catch a page mid-write; the backup API
 * copies the database as one connection sees it at one moment, WAL
 * included, while the server goes on reading and writing.
 */

/** `data/backups/starledger-2026-12-02T031500Z.sqlite` beside the database's folder. */
export function defaultBackupPath(databaseFile: string, at: Date): string {
  const stamp = at.toISOString().replace(/[:-]/g, '').replace(/\.\d+Z$/, 'Z');
  return path.join(path.dirname(path.resolve(databaseFile)), 'backups', `starledger-${stamp}.sqlite`);
}

function integrityOf(file: string): string {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    return (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join('; ');
  } finally {
    db.close();
  }
}

/**
 * Copies the live database to `destination` (a new file) and checks the
 * copy. After the first step the rest goes in one step: a write by another
 * connection between steps makes SQLite start over, and under steady
 * writes small steps might never finish. In WAL mode the one step holds
 * only a read snapshot, so writers are not held up.
 */
export async function backupDatabase(databaseFile: string, destination: string): Promise<{ pages: number; bytes: number }> {
  if (fs.existsSync(destination)) throw new Error(`${destination} already exists; a backup never overwrites a file.`);
  fs.mkdirSync(path.dirname(destination), { recursive: true });
  const source = new Database(databaseFile, { readonly: true, fileMustExist: true });
  let pages = 0;
  try {
    const result = await source.backup(destination, { progress: ({ totalPages }) => Math.max(totalPages, 100) });
    pages = result.totalPages;
  } catch (err) {
    fs.rmSync(destination, { force: true });
    throw err;
  } finally {
    source.close();
  }
  const integrity = integrityOf(destination);
  if (integrity !== 'ok') throw new Error(`The backup ${destination} failed its integrity check: ${integrity}`);
  return { pages, bytes: fs.statSync(destination).size };
}

/**
 * Whether another process has the database open (a running server): SQLite
 * grants exclusive locking mode only when no other connection is attached
 * to the file's WAL.
 */
export function databaseInUse(databaseFile: string): boolean {
  if (!fs.existsSync(databaseFile)) return false;
  const probe = new Database(databaseFile, { fileMustExist: true });
  try {
    probe.pragma('busy_timeout = 0');
    probe.pragma('locking_mode = EXCLUSIVE');
    probe.exec('BEGIN EXCLUSIVE');
    probe.prepare('SELECT count(*) FROM sqlite_master').get();
    probe.exec('COMMIT');
    return false;
  } catch (err) {
    if ((err as { code?: string }).code?.startsWith('SQLITE_BUSY')) return true;
    throw err;
  } finally {
    probe.close();
  }
}

export class DatabaseInUseError extends Error {
  override name = 'DatabaseInUseError';
}

/**
 * Writes a backup over the database, through the backup API as well, so
 * that the -wal and -shm files beside it stay consistent with the new
 * content. Refuses while a server has the database open unless `force`:
 * that server would go on with what it had cached (a session, a token's
 * stamp) and should be restarted.
 */
export async function restoreDatabase(backupFile: string, databaseFile: string, options: { force?: boolean } = {}): Promise<{ pages: number }> {
  const integrity = integrityOf(backupFile);
  if (integrity !== 'ok') throw new Error(`${backupFile} is not a sound backup: ${integrity}`);
  if (!options.force && databaseInUse(databaseFile)) {
    throw new DatabaseInUseError(
      `${databaseFile} is open in another process (a running Starledger server?). Stop the server and restore again, or pass --force to write over the live database and restart the server afterwards.`,
    );
  }
  fs.mkdirSync(path.dirname(path.resolve(databaseFile)), { recursive: true });
  const source = new Database(backupFile, { readonly: true, fileMustExist: true });
  try {
    const result = await source.backup(databaseFile, { progress: ({ totalPages }) => Math.max(totalPages, 100) });
    return { pages: result.totalPages };
  } finally {
    source.close();
  }
}
