import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, DatabaseNotWritableError, migrateLatest } from '../../server/db/knex';
import { onPostgres } from '../support/test-database';

const root = path.resolve(import.meta.dirname, '../..');
let dir: string | undefined;
afterEach(() => {
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  dir = undefined;
});

async function migratedFile(): Promise<string> {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-ro-'));
  fs.chmodSync(dir, 0o755);
  const file = path.join(dir, 'db.sqlite');
  const db = createDb(`file:${file}`);
  await migrateLatest(db);
  await db.destroy();
  return file;
}

// A read-only SQLite file or folder at start-up; on PostgreSQL the server's permissions decide, and the error is the server's own.
describe.skipIf(onPostgres)('a database Starledger cannot write', () => {
  it('stops the server at start-up with a message naming the read-only file, not knex’s migration lock', async () => {
    const file = await migratedFile();
    fs.chmodSync(file, 0o444);
    // Root writes a mode-0444 file regardless, so as root the server is started as the unprivileged user "nobody".
    const asRoot = process.getuid?.() === 0;
    const childTmp = path.join(dir!, 'tmp');
    fs.mkdirSync(childTmp, { mode: 0o777 });
    fs.chmodSync(childTmp, 0o777);
    const run = spawnSync(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      cwd: root,
      encoding: 'utf8',
      timeout: 60_000,
      env: { ...process.env, DATABASE_URL: `file:${file}`, DATA_DIR: childTmp, TMPDIR: childTmp, PORT: '0', SESSION_SECRET: 'test', SEED_DEMO: 'false' },
      ...(asRoot ? { uid: 65534, gid: 65534 } : {}),
    });
    expect(run.status).toBe(1);
    expect(run.stderr).toContain(`cannot write its database ${file}`);
    expect(run.stderr).toMatch(/read-only for this process \(mode 0444/);
    expect(run.stderr).not.toMatch(/migrations_lock|migrate:unlock|take lock/i);
  }, 60_000);

  it('says so when the file was opened read-only', async () => {
    const file = await migratedFile();
    const db = createDb(`file:${file}`, { readonly: true });
    try {
      const failure = await migrateLatest(db).then(
        () => undefined,
        (err: unknown) => err,
      );
      expect(failure).toBeInstanceOf(DatabaseNotWritableError);
      expect((failure as Error).message).toMatch(/cannot write its database .*db\.sqlite: it was opened read-only/);
      expect((failure as Error).message).not.toMatch(/lock/i);
    } finally {
      await db.destroy();
    }
  });
});
