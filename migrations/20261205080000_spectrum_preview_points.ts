import { gunzipSync, gzipSync } from 'node:zlib';
import type { Knex } from 'knex';

/**
 * A spectrum's preview keeps its every point in preview_blob (gzipped JSON
 * of [wavelength m, flux] pairs) and only the points drawn in its summary,
 * beside their count: a summary of 600 000 points was parsed whole for every
 * look at the upload. Moves the points of spectra previewed before. Written
 * out here rather than imported, as a migration never changes with the code:
 * the points drawn are every n-th, n the smallest stride leaving at most
 * 1500, the first point kept.
 */
const MOST_POINTS_DRAWN = 1500;

interface StoredSpectrum {
  points: [number, number][];
  pointCount?: number;
}

const previewedSpectra = (knex: Knex) =>
  knex('uploads').where({ kind: 'spectrum', status: 'previewed' }).whereNotNull('summary_json').orderBy('id').select('id', 'summary_json', 'preview_blob');

export async function up(knex: Knex): Promise<void> {
  for (const u of await previewedSpectra(knex)) {
    const summary = JSON.parse(u.summary_json) as { spectrum: StoredSpectrum | null };
    if (!summary.spectrum || summary.spectrum.pointCount !== undefined) continue;
    const { points } = summary.spectrum;
    const stride = Math.max(1, Math.ceil(points.length / MOST_POINTS_DRAWN));
    summary.spectrum = { ...summary.spectrum, points: points.filter((_, i) => i % stride === 0), pointCount: points.length };
    await knex('uploads').where({ id: u.id }).update({ summary_json: JSON.stringify(summary), preview_blob: gzipSync(JSON.stringify(points)) });
  }
}

/** Puts every point back in the summary, and an empty list of rows in preview_blob. */
export async function down(knex: Knex): Promise<void> {
  for (const u of await previewedSpectra(knex)) {
    const summary = JSON.parse(u.summary_json) as { spectrum: StoredSpectrum | null };
    if (!summary.spectrum || summary.spectrum.pointCount === undefined || !u.preview_blob) continue;
    const { pointCount: _, ...drawn } = summary.spectrum;
    summary.spectrum = { ...drawn, points: JSON.parse(gunzipSync(u.preview_blob).toString('utf8')) };
    await knex('uploads').where({ id: u.id }).update({ summary_json: JSON.stringify(summary), preview_blob: gzipSync('[]') });
  }
}
