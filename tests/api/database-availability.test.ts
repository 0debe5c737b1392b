import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import express from 'express';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { errorHandler } from '../../server/middleware/error-handler';
import { createSecurityLog } from '../../server/lib/security-log';
import { systemClock } from '../../server/lib/clock';
import { TOUCH_INTERVAL_MS } from '../../server/modules/tokens/tokens.service';
import type { Clock } from '../../server/lib/clock';
import { makeWorld, signIn, type World, PASSWORD } from '../support/world';
import { onPostgres } from '../support/test-database';

let world: World | undefined;
let other: Database.Database | undefined;
let dir: string | undefined;
afterEach(async () => {
  if (other?.inTransaction) other.exec('ROLLBACK');
  other?.close();
  await world?.db.destroy();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  world = other = dir = undefined;
});

/** A clock the test moves by hand. */
function handClock(iso: string): Clock & { advance(ms: number): void } {
  let t = Date.parse(iso);
  return { now: () => new Date(t), advance: (ms) => (t += ms) };
}

async function fileWorld(clock?: Clock) {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-db-'));
  world = await makeWorld({ databaseFile: path.join(dir, 'db.sqlite'), clock });
  const { agent, csrf } = await signIn(world.app, 'observer');
  const made = await agent.post('/api/tokens').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, name: 'dome pipeline' }).expect(201);
  return { auth: `Bearer ${made.body.token as string}`, tokenId: made.body.apiToken.id as number };
}

/** The stamp is written after the response; give it a moment. */
const settle = () => new Promise((r) => setTimeout(r, 30));

// SQLite's single write lock (SQLITE_BUSY while another connection writes) and its pragmas; PostgreSQL has neither: writers lock rows, and a busy server is not an error the app answers.
describe.skipIf(onPostgres)('a database another connection is writing', () => {
  it('still answers bearer-token reads, and answers a write 503 with Retry-After instead of 500', async () => {
    const { auth } = await fileWorld();
    const w = world!;
    // Waiting 5 s for the lock would only slow the test; the behaviour is the same.
    await w.db.raw('PRAGMA busy_timeout = 200');
    other = new Database(path.join(dir!, 'db.sqlite'));
    other.exec('BEGIN IMMEDIATE');
    other.prepare("UPDATE projects SET description = 'held by a backup' WHERE id = ?").run(w.projectId);

    const read = await request(w.app).get(`/api/projects/${w.projectId}/targets`).set('Authorization', auth);
    expect(read.status).toBe(200);
    expect(read.body.items.map((t: { designation: string }) => t.designation)).toEqual(['T 1']);

    const write = await request(w.app).post(`/api/projects/${w.projectId}/targets`).set('Authorization', auth).send({ designation: 'B 1', ra: 1, dec: 1 });
    expect(write.status).toBe(503);
    expect(write.headers['retry-after']).toBe('5');
    expect(write.body.error.code).toBe('database_busy');

    other.exec('ROLLBACK');
    await request(w.app).post(`/api/projects/${w.projectId}/targets`).set('Authorization', auth).send({ designation: 'B 1', ra: 1, dec: 1 }).expect(201);
  });

  it('stamps a token’s last use at most once a minute, and catches up on a stamp skipped while the database was busy', async () => {
    const clock = handClock('2026-12-01T03:00:00.000Z');
    const { auth, tokenId } = await fileWorld(clock);
    const w = world!;
    const lastUsed = async () => (await w.db('api_tokens').where({ id: tokenId }).first('last_used_at')).last_used_at;

    await request(w.app).get('/api/projects').set('Authorization', auth).expect(200);
    await settle();
    expect(await lastUsed()).toBe('2026-12-01T03:00:00.000Z');

    clock.advance(TOUCH_INTERVAL_MS - 1000);
    await request(w.app).get('/api/projects').set('Authorization', auth).expect(200);
    await settle();
    expect(await lastUsed()).toBe('2026-12-01T03:00:00.000Z');

    // Due, but the database is locked: the read goes on and the stamp waits.
    clock.advance(2000);
    other = new Database(path.join(dir!, 'db.sqlite'));
    other.exec('BEGIN IMMEDIATE');
    other.prepare('UPDATE projects SET description = ? WHERE id = ?').run('held', w.projectId);
    const started = performance.now();
    await request(w.app).get('/api/projects').set('Authorization', auth).expect(200);
    expect(performance.now() - started).toBeLessThan(1000);
    other.exec('ROLLBACK');
    await settle();
    expect(await lastUsed()).toBe('2026-12-01T03:00:00.000Z');

    await request(w.app).get('/api/projects').set('Authorization', auth).expect(200);
    await settle();
    expect(await lastUsed()).toBe('2026-12-01T03:01:01.000Z');
  });
});

// SQLite's SQLITE_FULL on a file whose pages are capped (PRAGMA max_page_count); a PostgreSQL server's full disk is the server's, outside what a test can cap.
describe.skipIf(onPostgres)('a full disk', () => {
  it('answers 507 saying storage is full, and keeps what was there', async () => {
    const { auth } = await fileWorld();
    const w = world!;
    // SQLite's own limit on the file's size makes the next page it needs fail with SQLITE_FULL, as a full disk does.
    const pages = (await w.db.raw('PRAGMA page_count'))[0].page_count as number;
    await w.db.raw(`PRAGMA max_page_count = ${pages}`);
    const before = Number((await w.db('targets').count({ n: '*' }).first())!.n);
    // Targets with long notes until a page is needed that the limit refuses.
    let created = 0;
    let res: request.Response | undefined;
    for (let i = 0; i < 100; i++) {
      res = await request(w.app).post(`/api/projects/${w.projectId}/targets`).set('Authorization', auth).send({ designation: `F ${i}`, ra: 1, dec: 1, notes: 'x'.repeat(3900) });
      if (res.status !== 201) break;
      created++;
    }
    expect(res!.status).toBe(507);
    expect(res!.body.error.code).toBe('storage_full');
    expect(res!.body.error.message).toMatch(/storage is full/);
    expect(Number((await w.db('targets').count({ n: '*' }).first())!.n)).toBe(before + created);
  });

  it('answers 507 for the file system’s ENOSPC too (a file being written when the disk fills)', async () => {
    const app = express();
    app.get('/x', () => {
      throw Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC', errno: -28 });
    });
    app.use(errorHandler);
    app.locals.securityLog = createSecurityLog({ destination: { write: () => undefined }, clock: systemClock });
    const res = await request(app).get('/x');
    expect(res.status).toBe(507);
    expect(res.body.error.code).toBe('storage_full');
  });
});
