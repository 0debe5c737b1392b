import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Request, Response } from 'express';
import { describeForLog, errorHandler } from '../../server/middleware/error-handler';
import { makeWorld, signIn, type Session, type World } from '../support/world';
import { onPostgres } from '../support/test-database';
import { createSecurityLog } from '../../server/lib/security-log';
import { systemClock } from '../../server/lib/clock';

let world: World;
afterEach(async () => {
  vi.restoreAllMocks();
  await world?.db.destroy();
});

const uploadsUrl = (w: World) => `/api/projects/${w.projectId}/uploads`;

function send(s: Session, w: World, content: string, filename: string, fields: Record<string, string> = {}) {
  let req = s.agent.post(uploadsUrl(w)).set('X-CSRF-Token', s.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.from(content), filename);
}

describe('upload file names', () => {
  it('keeps a name with non-ASCII letters as sent, in the upload, the list and the download', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await send(s, world, 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n', 'Größe-α.csv');
    expect(res.status).toBe(201);
    expect(res.body.upload.filename).toBe('Größe-α.csv');
    const list = await s.agent.get(uploadsUrl(world)).expect(200);
    expect(list.body.uploads[0].filename).toBe('Größe-α.csv');
    const file = await s.agent.get(`${uploadsUrl(world)}/${res.body.upload.id}/file`).expect(200);
    expect(file.headers['content-disposition']).toBe(`attachment; filename*=UTF-8''${encodeURIComponent('Größe-α.csv')}`);
  });
});

describe('a spectrum for a target that does not exist', () => {
  it('answers 400 naming targetId, stores nothing and logs nothing of the file', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = await send(s, world, 'wavelength_nm,flux\n500,1.0\n510,1.1\nMARKER-IN-FILE,1\n', 'spectrum.csv', { kind: 'spectrum', targetId: '987654' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details).toEqual([{ path: 'targetId', message: expect.stringMatching(/no target with id 987654/) }]);
    expect(await world.db('uploads').count<{ n: number }[]>('* as n')).toEqual([{ n: 0 }]);
    expect(logged).not.toHaveBeenCalled();
  });

  it('answers 400 for another project’s target as for a missing one', async () => {
    world = await makeWorld();
    const at = '2026-11-30T22:00:00.000Z';
    const [other] = await world.db('targets')
      .insert({ project_id: world.otherProjectId, designation: 'O 1', designation_key: 'o1', ra_deg: 1, dec_deg: 1, notes: '', tags: '[]', created_at: at, updated_at: at })
      .returning('id');
    const s = await signIn(world.app, 'observer');
    const res = await send(s, world, 'wavelength_nm,flux\n500,1.0\n', 'spectrum.csv', { kind: 'spectrum', targetId: String(other.id) });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('targetId');
  });
});

describe('the log of an unexpected error', () => {
  it('keeps the SQL and the cause but never the values bound to it', async () => {
    world = await makeWorld();
    const secret = Buffer.from('CONTENT-OF-A-FILE');
    const failure = await world.db('uploads')
      .insert({ project_id: 999_999, user_id: null, kind: 'measurements', filename: 'x.csv', size_bytes: 1, sha256: 'SHA-MARKER', content: secret, status: 'previewed', created_at: 'now' })
      .then(() => null, (e: unknown) => e);
    expect(failure).toBeInstanceOf(Error);
    const written: string[] = [];
    const securityLog = createSecurityLog({ destination: { write: (line: string) => void written.push(line) }, clock: systemClock });
    const res = { headersSent: false, locals: {}, status: vi.fn().mockReturnThis(), json: vi.fn() } as unknown as Response;
    errorHandler(failure, { method: 'POST', baseUrl: '/api', path: '/projects/1/uploads', app: { locals: { securityLog } } } as unknown as Request, res, () => undefined);
    expect(res.status).toHaveBeenCalledWith(500);
    // The log's lines are JSON (server/lib/security-log.ts): the cause is read from the line's error field, not from its escaped text.
    const text = written.map((line) => String((JSON.parse(line) as { error?: unknown }).error)).join('\n');
    for (const leak of ['CONTENT-OF-A-FILE', 'SHA-MARKER']) expect(written.join('\n')).not.toContain(leak);
    // The cause in each engine's words (SQLite's result codes page; PostgreSQL's error 23503, foreign_key_violation), the SQL in its quoting.
    expect(text).toMatch(onPostgres ? /violates foreign key constraint "uploads_project_id_foreign"/ : /FOREIGN KEY constraint failed/);
    expect(text).toMatch(onPostgres ? /insert into "uploads"/ : /insert into `uploads`/);
    for (const leak of [secret.toString('hex'), 'CONTENT-OF-A-FILE', 'SHA-MARKER']) expect(text).not.toContain(leak);
    expect(describeForLog({ body: 'a request body' })).not.toContain('a request body');
  });
});

/** A long file of `n` parallaxes for `targets` new targets, each target's first row giving its position. */
function manyRows(n: number, targets: number, value: (i: number) => string = (i) => (10 + (i % 50) / 10).toFixed(2)): string {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,observed_at'];
  for (let i = 0; i < n; i += 1) {
    const t = i % targets;
    const position = i < targets ? `${(t * 0.01).toFixed(4)},${(-10 + t * 0.001).toFixed(4)}` : ',';
    lines.push(`N ${t + 1},${position},parallax,${value(i)},0.2,mas,2026-11-30T${String(20 + Math.floor(i / targets) % 4).padStart(2, '0')}:${String(Math.floor(i / targets / 4) % 60).padStart(2, '0')}:00Z`);
  }
  return `${lines.join('\n')}\n`;
}

describe('an upload with many errors stays small to show', () => {
  it('carries the error count and the first 20 errors, and pages the rest from …/errors', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await send(s, world, manyRows(300, 30, () => 'abc'), 'bad.csv');
    expect(res.status).toBe(201);
    const id = res.body.upload.id;
    expect(res.body.upload.errorCount).toBe(300);
    expect(res.body.upload.errors).toHaveLength(20);
    const list = await s.agent.get(uploadsUrl(world)).expect(200);
    expect(list.body.uploads[0].errorCount).toBe(300);
    expect(list.body.uploads[0].errors.map((e: { row: number }) => e.row)).toEqual(Array.from({ length: 20 }, (_, i) => i + 2));
    const single = await s.agent.get(`${uploadsUrl(world)}/${id}`).expect(200);
    expect(single.body.upload.errors).toHaveLength(20);

    const page = await s.agent.get(`${uploadsUrl(world)}/${id}/errors?page=3&pageSize=100`).expect(200);
    expect(page.body.total).toBe(300);
    expect(page.body.errors).toHaveLength(100);
    expect(page.body.errors[0]).toEqual({ row: 202, column: 'value', message: 'the value must be a number (got "abc").' });
    const commit = await s.agent.post(`${uploadsUrl(world)}/${id}/commit`).set('X-CSRF-Token', s.csrf).send({}).expect(422);
    expect(commit.body.error.details).toHaveLength(20);
  });

  it('keeps a file whose every line is wrong in less room than the file, and pages its errors across the stored chunks in file order', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // 2 000 lines, each with three errors (position out of range, value not a number, unknown unit), over four chunks of 500 lines.
    const lines = ['target,ra,dec,quantity,value,uncertainty,unit'];
    for (let i = 0; i < 2000; i += 1) lines.push(`Q ${i},400,95,parallax,v${i},0.2,furlong`);
    const file = `${lines.join('\n')}\n`;
    const res = await send(s, world, file, 'all-wrong.csv').expect(201);
    const id = res.body.upload.id;
    const total = res.body.upload.errorCount;
    expect(total).toBeGreaterThanOrEqual(3 * 2000);
    const chunks = await world.db('upload_error_chunks').where({ upload_id: id }).select('errors');
    const stored = chunks.reduce((n: number, c: { errors: Buffer }) => n + c.errors.length, 0);
    expect(stored).toBeLessThan(Buffer.byteLength(file));

    // Every error, page by page (pages of 300 cross the 500-line chunks at different places), in file order, none twice.
    const all: { row: number; message: string }[] = [];
    for (let page = 1; (page - 1) * 300 < total; page += 1) {
      all.push(...(await s.agent.get(`${uploadsUrl(world)}/${id}/errors?page=${page}&pageSize=300`).expect(200)).body.errors);
    }
    expect(all).toHaveLength(total);
    expect(all.every((e, i) => i === 0 || all[i - 1].row <= e.row)).toBe(true);
    expect(new Set(all.map((e) => e.row)).size).toBe(2000);
    expect(all.filter((e) => e.row === 1501).map((e) => e.message).join(' ')).toMatch(/"v1499"/);
    // The rows with errors, and one page of them past the first chunk with each row's own errors.
    const bad = await s.agent.get(`${uploadsUrl(world)}/${id}/rows?page=3&pageSize=200&onlyErrors=true`).expect(200);
    expect(bad.body.total).toBe(2000);
    expect(bad.body.rows.map((r: { row: number }) => r.row)).toEqual(Array.from({ length: 200 }, (_, i) => 402 + i));
    expect(bad.body.rows[150].errors).toEqual(all.filter((e) => e.row === 552));
  });

  it('answers one page of rows from the stored chunks, without reading the file again', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // Every seventh record after each target's first is wrong.
    const wrong = (i: number) => i >= 40 && i % 7 === 0;
    const res = await send(s, world, manyRows(1200, 40, (i) => (wrong(i) ? 'x' : '12.5')), 'mixed.csv');
    const id = res.body.upload.id;
    // Were the page read from the file, these bytes would no longer parse.
    await world.db('uploads').where({ id }).update({ content: Buffer.from([0, 1, 2, 3]) });
    const page = await s.agent.get(`${uploadsUrl(world)}/${id}/rows?page=6&pageSize=100`).expect(200);
    expect(page.body.total).toBe(1200);
    expect(page.body.rows.map((r: { row: number }) => r.row)).toEqual(Array.from({ length: 100 }, (_, i) => 502 + i));
    // Row 506 is record 504 (a multiple of 7), for target N 25 (504 mod 40 = 24).
    const row506 = page.body.rows.find((r: { row: number }) => r.row === 506);
    expect(row506.cells.slice(0, 5)).toEqual(['N 25', '', '', 'parallax', 'x']);
    expect(row506.errors).toEqual([{ row: 506, column: 'value', message: 'the value must be a number (got "x").' }]);
    expect(page.body.rows.find((r: { row: number }) => r.row === 505).errors).toEqual([]);
    const bad = await s.agent.get(`${uploadsUrl(world)}/${id}/rows?page=2&pageSize=50&onlyErrors=true`).expect(200);
    const wrongRows = Array.from({ length: 1200 }, (_, i) => i).filter(wrong).map((i) => i + 2);
    expect(bad.body.total).toBe(wrongRows.length);
    expect(bad.body.rows.map((r: { row: number }) => r.row)).toEqual(wrongRows.slice(50, 100));
    expect(bad.body.rows.every((r: { cells: string[]; errors: unknown[] }) => r.cells[4] === 'x' && r.errors.length === 1)).toBe(true);
  });
});

async function previewBytes(w: World, id: number) {
  const row = await w.db('uploads').where({ id }).first(w.db.raw('coalesce(length(preview_blob), 0) + coalesce(length(preview_json), 0) as n'), 'size_bytes');
  return { preview: Number(row.n), file: Number(row.size_bytes) };
}

describe('the stored preview', () => {
  it('is smaller than the file, and is dropped on commit and on discard while the file stays', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = manyRows(5000, 500);
    const first = await send(s, world, file, 'a.csv').expect(201);
    const stored = await previewBytes(world, first.body.upload.id);
    expect(stored.file).toBe(Buffer.byteLength(file));
    expect(stored.preview).toBeGreaterThan(0);
    expect(stored.preview / stored.file).toBeLessThan(1);
    await s.agent.post(`${uploadsUrl(world)}/${first.body.upload.id}/commit`).set('X-CSRF-Token', s.csrf).send({}).expect(200);
    expect((await previewBytes(world, first.body.upload.id)).preview).toBe(0);

    const second = await send(s, world, manyRows(50, 5), 'b.csv').expect(201);
    await s.agent.post(`${uploadsUrl(world)}/${second.body.upload.id}/discard`).set('X-CSRF-Token', s.csrf).expect(200);
    expect((await previewBytes(world, second.body.upload.id)).preview).toBe(0);
    const raw = await s.agent.get(`${uploadsUrl(world)}/${second.body.upload.id}/file`).buffer(true).expect(200);
    expect(raw.body.toString()).toBe(manyRows(50, 5));
  });

  it('expires when left uncommitted longer than the set time, with a trail entry; younger previews stay', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const old = await send(s, world, manyRows(20, 2), 'old.csv').expect(201);
    // The world's clock says 2026-12-01T03:00Z; this preview is one hour younger.
    await world.db('uploads').insert({ ...(await world.db('uploads').where({ id: old.body.upload.id }).first()), id: undefined, filename: 'young.csv', created_at: '2026-12-01T04:00:00.000Z' });
    const { createUploadsService } = await import('../../server/modules/uploads/uploads.service');
    const { fixedClock } = await import('../../server/lib/clock');
    const later = createUploadsService(world.db, fixedClock('2026-12-03T03:30:00.000Z'));
    expect(await later.expirePreviews(48 * 3_600_000)).toBe(1);
    const after = await s.agent.get(uploadsUrl(world)).expect(200);
    const byName = Object.fromEntries(after.body.uploads.map((u: { filename: string; status: string }) => [u.filename, u.status]));
    expect(byName).toEqual({ 'old.csv': 'discarded', 'young.csv': 'previewed' });
    expect((await previewBytes(world, old.body.upload.id)).preview).toBe(0);
    const trail = await world.db('trail_events').where({ action: 'upload.expired', entity_id: old.body.upload.id });
    expect(trail).toHaveLength(1);
    expect(trail[0].actor_user_id).toBeNull();
    const raw = await s.agent.get(`${uploadsUrl(world)}/${old.body.upload.id}/file`).buffer(true).expect(200);
    expect(raw.body.toString()).toBe(manyRows(20, 2));
    expect(await later.expirePreviews(48 * 3_600_000)).toBe(0);
  });

  it('expires a preview once when two processes expire at the same moment: one trail entry, counted by the one that did it', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const ids: number[] = [];
    for (const name of ['first.csv', 'second.csv', 'third.csv']) ids.push((await send(s, world, manyRows(20, 2), name).expect(201)).body.upload.id);
    const { createUploadsService } = await import('../../server/modules/uploads/uploads.service');
    const { fixedClock } = await import('../../server/lib/clock');
    // Two services on one database, as in two processes; started together, both find the same three previews.
    const expiry = () => createUploadsService(world.db, fixedClock('2026-12-03T03:30:00.000Z')).expirePreviews(48 * 3_600_000);
    const counts = await Promise.all([expiry(), expiry()]);
    expect(counts[0] + counts[1]).toBe(3);
    const trail = await world.db('trail_events').where({ action: 'upload.expired' }).orderBy('entity_id').pluck('entity_id');
    expect(trail).toEqual(ids);
  });
});
