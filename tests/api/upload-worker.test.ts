import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import type { UploadProgress } from '../../shared/schemas/uploads';
import { workerUploadJobs, type UploadJobs } from '../../server/modules/uploads/upload-jobs';
import { makeWorld, signIn, type World } from '../support/world';
import { newTestDatabase, onPostgres, type TestDatabase } from '../support/test-database';

let world: World | undefined;
let jobs: UploadJobs | undefined;
let dir: string | undefined;
let database: TestDatabase | undefined;
afterEach(async () => {
  await jobs?.close();
  await world?.db.destroy();
  await database?.drop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  world = jobs = dir = database = undefined;
});

/** A world on a database file (or its own PostgreSQL database), its uploads read and committed by a worker thread with its own connection. */
async function workerWorld(): Promise<World> {
  fs.mkdirSync('data', { recursive: true });
  dir = fs.mkdtempSync(path.join('data', 'test-upload-worker-'));
  database = await newTestDatabase(`file:${path.join(dir, 'db.sqlite')}`);
  jobs = workerUploadJobs(database.url);
  world = await makeWorld({ databaseUrl: database.url, uploadJobs: jobs });
  return world;
}

function season(rows: number, targets: number): string {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,band,observed_at'];
  for (let i = 0; i < rows; i += 1) {
    const t = i % targets;
    const position = i < targets ? `${(t * 0.5).toFixed(2)},${(-40 + t * 0.1).toFixed(2)}` : ',';
    lines.push(`W ${t + 1},${position},magnitude,${(6 + (i % 40) / 10).toFixed(2)},0.02,mag,V,2026-11-${String(1 + Math.floor(i / targets)).padStart(2, '0')}T22:00:00Z`);
  }
  return `${lines.join('\n')}\n`;
}

describe('uploads on the worker thread', () => {
  it('commits whole on its own connection while the request thread answers readers and reports its progress', { timeout: 60_000 }, async () => {
    const w = await workerWorld();
    const s = await signIn(w.app, 'observer');
    const reader = await signIn(w.app, 'reader');
    const made = await s.agent.post(`/api/projects/${w.projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', Buffer.from(season(6000, 300)), 'season.csv').expect(201);
    expect(made.body.upload.errorCount).toBe(0);
    expect(made.body.upload.newTargets).toHaveLength(300);
    const id = made.body.upload.id;

    let settled = false;
    const commit = s.agent
      .post(`/api/projects/${w.projectId}/uploads/${id}/commit`)
      .set('X-CSRF-Token', s.csrf)
      .send({})
      .then((r) => {
        settled = true;
        return r;
      });
    const seen: UploadProgress[] = [];
    const fromRow: string[] = [];
    let readsAnswered = 0;
    while (!settled) {
      const [p, t, row] = await Promise.all([
        reader.agent.get(`/api/projects/${w.projectId}/uploads/${id}/progress`),
        reader.agent.get(`/api/projects/${w.projectId}/targets/${w.targetId}`),
        w.db('uploads').where({ id }).first('commit_progress_json'),
      ]);
      if (!settled) readsAnswered += t.status === 200 ? 1 : 0;
      if (p.body.progress) seen.push(p.body.progress);
      if (!settled && row?.commit_progress_json) fromRow.push((JSON.parse(row.commit_progress_json) as UploadProgress).phase);
      await new Promise((r) => setTimeout(r, 20));
    }
    const done = await commit;
    expect(done.status).toBe(200);
    expect(done.body.measurementsAdded).toBe(6000);
    expect(done.body.targetsCreated).toHaveLength(300);
    // Readers were answered while the commit ran, and saw it move.
    expect(readsAnswered).toBeGreaterThan(0);
    expect(seen.some((p) => p.phase === 'writing' || p.phase === 'deriving')).toBe(true);
    const last = (await s.agent.get(`/api/projects/${w.projectId}/uploads/${id}/progress`).expect(200)).body.progress;
    expect(last).toEqual({ uploadId: id, phase: 'done', rowsWritten: 6000, rowsTotal: 6000, targetsDerived: 300, targetsTotal: 300 });
    // The process running the commit wrote its end to the upload's row, where another app process on the same database reads it.
    expect(JSON.parse((await w.db('uploads').where({ id }).first('commit_progress_json')).commit_progress_json)).toEqual(last);
    // On PostgreSQL another process follows the commit from that row while it runs: the progress is written outside the
    // commit's transaction, which must not hold the row's lock meanwhile (on SQLite only the end is written).
    // ('deriving' is reported inside the transaction, after the rows are written.)
    if (onPostgres) expect(fromRow, fromRow.join(' ')).toContain('deriving');
    // The project's target count, kept by triggers (per statement on PostgreSQL), counts the 300 targets the file created.
    const counted = await w.db('targets').where({ project_id: w.projectId }).count<{ n: number }[]>('* as n');
    expect((await w.db('projects').where({ id: w.projectId }).first('target_count')).target_count).toBe(Number(counted[0].n));

    expect(Number((await w.db('measurements').count<{ n: number }[]>('* as n'))[0].n)).toBe(6000);
    // Each target the file created has its own trail entry, as one made by hand.
    const created = await w.db('trail_events').where({ action: 'target.created' });
    expect(created).toHaveLength(300);
    expect(JSON.parse(created[0].after_json)).toMatchObject({ uploadId: id, row: 2 });
  });

  it('brings a refusal from the worker back as the same answer, and imports nothing', { timeout: 30_000 }, async () => {
    const w = await workerWorld();
    const s = await signIn(w.app, 'observer');
    const made = await s.agent.post(`/api/projects/${w.projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', Buffer.from(season(10, 5)), 'night.csv').expect(201);
    // The preview is gone (as if expired between the check and the commit): the worker refuses.
    await w.db('uploads').where({ id: made.body.upload.id }).update({ summary_json: null });
    const res = await s.agent.post(`/api/projects/${w.projectId}/uploads/${made.body.upload.id}/commit`).set('X-CSRF-Token', s.csrf).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/no preview/);
    expect(Number((await w.db('measurements').count<{ n: number }[]>('* as n'))[0].n)).toBe(0);
    const bad = await s.agent.post(`/api/projects/${w.projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', Buffer.from([0, 1, 2]), 'x.csv');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('file');
  });
});

// SQLite's one write lock, held by another connection, and better-sqlite3's synchronous wait for it; PostgreSQL locks rows, and a reader never waits for a writer.
describe.skipIf(onPostgres)('a signed-in reader while the write lock is held elsewhere', () => {
  it('is answered at once: the session is touched only when that needs no wait', { timeout: 30_000 }, async () => {
    const w = await workerWorld();
    const reader = await signIn(w.app, 'reader');
    // Another connection (a commit on the worker, a backup) holds the write lock.
    const holder = new Database(path.join(dir!, 'db.sqlite'));
    holder.exec('begin immediate');
    try {
      for (let i = 0; i < 3; i += 1) {
        const t0 = performance.now();
        await reader.agent.get(`/api/projects/${w.projectId}/targets/${w.targetId}`).expect(200);
        // busy_timeout is 5 s: a read that waited for a write would take that long.
        expect(performance.now() - t0).toBeLessThan(1000);
      }
    } finally {
      holder.exec('rollback');
      holder.close();
    }
  });
});
