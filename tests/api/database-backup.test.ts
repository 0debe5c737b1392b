import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, migrateLatest } from '../../server/db/knex';
import { onPostgres } from '../support/test-database';

const root = path.resolve(import.meta.dirname, '../..');
let dir: string | undefined;
let writer: ChildProcess | undefined;
afterEach(() => {
  writer?.kill('SIGKILL');
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  dir = writer = undefined;
});

const BATCH = 10;

/** A second process committing targets in batches of ten, one transaction each, as fast as it can, until killed. */
function startWriter(file: string): ChildProcess {
  const code = `
    const Database = require('better-sqlite3');
    const db = new Database(${JSON.stringify(file)});
    db.pragma('journal_mode = WAL');
    db.pragma('busy_timeout = 5000');
    const insert = db.prepare("INSERT INTO targets (project_id, designation, designation_key, ra_deg, dec_deg, notes, tags, created_at, updated_at) VALUES (1, ?, ?, 1, 1, '', '[]', 'x', 'x')");
    let n = 0;
    const batch = db.transaction(() => { for (let i = 0; i < ${BATCH}; i++) { n++; insert.run('L ' + n, 'l' + n); } });
    for (;;) batch();
  `;
  return spawn(process.execPath, ['-e', code], { cwd: root, stdio: 'ignore' });
}

function cli(args: string[], databaseFile: string) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    timeout: 60_000,
    env: { ...process.env, DATABASE_URL: `file:${databaseFile}` },
  });
}

const targetIds = (file: string): number[] => {
  const db = new Database(file, { readonly: true });
  try {
    return (db.prepare('SELECT id FROM targets ORDER BY id').all() as { id: number }[]).map((r) => r.id);
  } finally {
    db.close();
  }
};

/** A migrated database file in a fresh folder, with one project of that name, and its connection. */
async function liveDatabase(projectName: string) {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-backup-'));
  const live = path.join(dir, 'live.sqlite');
  const db = createDb(`file:${live}`);
  await migrateLatest(db);
  const site = { site_name: 's', site_latitude_deg: 0, site_longitude_deg: 0, site_elevation_m: 0, site_time_zone: 'Etc/UTC' };
  await db('projects').insert({ code: 'B', name: projectName, description: '', ...site, created_at: 'x', updated_at: 'x' });
  return { live, db };
}

// db:backup and db:restore copy a SQLite file with its online backup API; a PostgreSQL database is backed up with pg_dump (README).
describe.skipIf(onPostgres)('db:backup and db:restore', () => {
  it('back up a database another process is writing, and the restore holds every row committed before the backup began', async () => {
    const { live, db } = await liveDatabase('Before');
    await db.destroy();

    writer = startWriter(live);
    const watcher = new Database(live, { readonly: true });
    const committed = () => (watcher.prepare('SELECT count(*) AS n FROM targets').get() as { n: number }).n;
    while (committed() < 5_000) await new Promise((r) => setTimeout(r, 50));
    const before = committed();
    const backup = path.join(dir!, 'backup.sqlite');
    const run = cli(['backup', '--to', backup], live);
    const after = committed();
    watcher.close();
    expect(run.stderr).toBe('');
    expect(run.stdout).toMatch(/integrity ok/);
    // Still writing while the backup ran: the backup was online.
    expect(after).toBeGreaterThan(before);
    writer.kill('SIGKILL');

    const restored = path.join(dir!, 'restored.sqlite');
    const restore = cli(['restore', backup], restored);
    expect(restore.status, restore.stderr).toBe(0);
    const ids = targetIds(restored);
    // Every row committed before the backup began, whole transactions only, and ids without a gap.
    expect(ids.length).toBeGreaterThanOrEqual(before);
    expect(ids.length % BATCH).toBe(0);
    expect(ids[ids.length - 1]).toBe(ids.length);
    const check = new Database(restored, { readonly: true });
    expect(check.pragma('integrity_check', { simple: true })).toBe('ok');
    check.close();
  }, 60_000);

  it('refuses to write over a database a server has open unless told --force', async () => {
    const { live, db } = await liveDatabase('Before');
    const backup = path.join(dir!, 'b.sqlite');
    expect(cli(['backup', '--to', backup], live).status).toBe(0);
    await db('projects').update({ name: 'After' });
    await db('projects').first(); // the connection stays open, as a running server's does

    const refused = cli(['restore', backup], live);
    expect(refused.status).toBe(3);
    expect(refused.stderr).toMatch(/open in another process .*--force/s);
    expect((await db('projects').first()).name).toBe('After');

    const forced = cli(['restore', backup, '--force'], live);
    expect(forced.status, forced.stderr).toBe(0);
    // The open connection sees the restored content: SQLite noticed the change through its own locks.
    expect((await db('projects').first()).name).toBe('Before');
    await db.destroy();
  }, 60_000);
});
