import { afterEach, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/knex';
import { migrationSource } from '../../migrations';
import { newTestDatabase, type TestDatabase } from '../support/test-database';

/**
 * Uploads previewed before row errors were kept in compressed chunks had
 * them one table row each (upload_errors): the migrations move them into
 * chunks, and the upload's errors read the same afterwards.
 */
let db: Db | undefined;
let database: TestDatabase | undefined;
afterEach(async () => {
  await db?.destroy();
  await database?.drop();
  db = database = undefined;
});

describe('moving stored row errors into chunks', () => {
  it('keeps every error of an upload previewed before, in file order, and drops the old table', async () => {
    database = await newTestDatabase('file::memory:', { migrated: false });
    db = createDb(database.url);
    const names = await migrationSource.getMigrations([]);
    const before = names.indexOf('20261202190000_upload_error_chunks');
    for (let i = 0; i < before; i += 1) await db.migrate.up({ migrationSource });
    const at = '2026-11-30T22:00:00.000Z';
    const [user] = await db('users').insert({ email: 'o@test.invalid', name: 'O', password_hash: 'x', is_site_admin: false, created_at: at, updated_at: at }).returning('id');
    const site = { site_name: 'S', site_latitude_deg: 0, site_longitude_deg: 0, site_elevation_m: 0, site_time_zone: 'Etc/UTC' };
    const [project] = await db('projects').insert({ code: 'M', name: 'M', description: '', ...site, created_at: at, updated_at: at }).returning('id');
    const [upload] = await db('uploads')
      .insert({ project_id: project.id, user_id: user.id, kind: 'measurements', filename: 'old.csv', size_bytes: 1, sha256: 'x', content: Buffer.from('x'), status: 'previewed', created_at: at })
      .returning('id');
    // Rows 1 (the header), 2 and 501 (the first chunk), 502 (the second), written out of order as a preview could have.
    const old = [
      { row: 502, column: 'unit', message: 'unknown unit "furlong".' },
      { row: 1, column: 'header', message: 'no column for the value.' },
      { row: 2, column: 'value', message: 'the value must be a number (got "a").' },
      { row: 2, column: 'unit', message: 'unknown unit "b".' },
      { row: 501, column: 'value', message: 'the value must be a number (got "c").' },
    ];
    for (const e of old) await db('upload_errors').insert({ upload_id: upload.id, ...e });

    await db.migrate.latest({ migrationSource });
    expect(await db.schema.hasTable('upload_errors')).toBe(false);
    const chunks = await db('upload_error_chunks').where({ upload_id: upload.id }).orderBy('chunk').select('chunk', 'error_count', 'row_count');
    expect(chunks.map((c) => [c.chunk, c.error_count, c.row_count])).toEqual([
      [-1, 1, 1],
      [0, 3, 2],
      [1, 1, 1],
    ]);
    const { listErrors } = await import('../../server/modules/uploads/uploads.repository');
    const order = (e: { row: number }) => e.row;
    expect(await listErrors(db, upload.id, { offset: 0, limit: 10 })).toEqual([...old].sort((a, b) => order(a) - order(b)));
    expect(await listErrors(db, upload.id, { offset: 2, limit: 2 })).toEqual([old[3], old[4]]);
  });
});
