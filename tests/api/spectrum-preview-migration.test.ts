import { gzipSync } from 'node:zlib';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/knex';
import { migrationSource } from '../../migrations';
import { findUpload, loadPreviewState } from '../../server/modules/uploads/uploads.repository';
import { MOST_POINTS_DRAWN } from '../../shared/schemas/spectrum-drawing';
import { newTestDatabase, type TestDatabase } from '../support/test-database';

/**
 * Spectra previewed before their points moved out of the summary kept every
 * point in summary_json: the migration moves them into preview_blob, the
 * commit still reads every one, and a look at the upload reads only those drawn.
 */
let db: Db | undefined;
let database: TestDatabase | undefined;
afterEach(async () => {
  await db?.destroy();
  await database?.drop();
  db = database = undefined;
});

const MIGRATION = '20261205080000_spectrum_preview_points';
const points: [number, number][] = Array.from({ length: 4000 }, (_, i) => [(350 + i * 0.1) * 1e-9, 1 + i / 4000]);
const fit = { temperatureK: 5800, temperatureSigmaK: 12, logScale: 1, reducedChiSquare: 1, weighted: false, noiseWords: null, peakWavelengthM: 5e-7, peakWavelengthSigmaM: 1e-9, noPeakReason: null, warnings: [] };

async function databaseBefore(): Promise<{ db: Db; projectId: number; uploadId: number }> {
  database = await newTestDatabase('file::memory:', { migrated: false });
  db = createDb(database.url);
  const names = await migrationSource.getMigrations([]);
  for (let i = 0; i < names.indexOf(MIGRATION); i += 1) await db.migrate.up({ migrationSource });
  const at = '2026-11-30T22:00:00.000Z';
  const [user] = await db('users').insert({ email: 'o@test.invalid', name: 'O', password_hash: 'x', is_site_admin: false, created_at: at, updated_at: at }).returning('id');
  const site = { site_name: 'S', site_latitude_deg: 0, site_longitude_deg: 0, site_elevation_m: 0, site_time_zone: 'Etc/UTC' };
  const [project] = await db('projects').insert({ code: 'M', name: 'M', description: '', ...site, created_at: at, updated_at: at }).returning('id');
  const [target] = await db('targets')
    .insert({ project_id: project.id, designation: 'T 1', designation_key: 't1', ra_deg: 10, dec_deg: -5, notes: '', tags: '[]', created_at: at, updated_at: at })
    .returning('id');
  const summary = { headers: ['wavelength_nm', 'flux'], measurementCount: 0, newTargets: [], newTargetErrorRows: 0, everyRowKnownTarget: false, cautions: [], duplicateOf: null, spectrum: { targetId: target.id, wavelengthUnit: 'nm', points, fit } };
  const [upload] = await db('uploads')
    .insert({
      project_id: project.id, user_id: user.id, kind: 'spectrum', filename: 'old.csv', size_bytes: 1, sha256: 'x', content: Buffer.from('x'), status: 'previewed', target_id: target.id, created_at: at,
      row_count: points.length, error_count: 0, mapping_json: '{}', summary_json: JSON.stringify(summary), preview_blob: gzipSync('[]'),
    })
    .returning('id');
  return { db, projectId: project.id, uploadId: upload.id };
}

describe('moving a previewed spectrum’s points out of its summary', () => {
  it('keeps every point for the commit and answers only those drawn, with their count', async () => {
    const { db, projectId, uploadId } = await databaseBefore();
    await db.migrate.latest({ migrationSource });
    const state = await loadPreviewState(db, uploadId);
    expect(state?.spectrum?.points).toEqual(points);
    expect(state?.spectrum?.fit).toEqual(fit);
    const upload = await findUpload(db, projectId, uploadId);
    expect(upload?.spectrum?.pointCount).toBe(4000);
    // Every third point: the smallest stride leaving at most 1500 of 4000.
    expect(upload?.spectrum?.points.length).toBeLessThanOrEqual(MOST_POINTS_DRAWN);
    expect(upload?.spectrum?.points).toEqual(points.filter((_, i) => i % 3 === 0));
    const summary = JSON.parse((await db('uploads').where({ id: uploadId }).first('summary_json')).summary_json);
    expect(summary.spectrum.points).toHaveLength(1334);
  });

  it('puts them back when rolled back', async () => {
    const { db, uploadId } = await databaseBefore();
    const before = await db('uploads').where({ id: uploadId }).first('summary_json');
    await db.migrate.up({ migrationSource });
    await db.migrate.down({ migrationSource });
    const after = await db('uploads').where({ id: uploadId }).first('summary_json');
    expect(JSON.parse(after.summary_json)).toEqual(JSON.parse(before.summary_json));
  });
});
