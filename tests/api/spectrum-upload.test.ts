import { afterEach, describe, expect, it } from 'vitest';
import { syntheticSpectrum } from '../support/synthetic-spectrum';
import { makeWorld, signIn, type Session, type World } from '../support/world';
import { loadPreviewState } from '../../server/modules/uploads/uploads.repository';

let world: World;
afterEach(async () => world?.db.destroy());

async function uploadSpectrum(s: Session, w: World, csv: string) {
  return s.agent
    .post(`/api/projects/${w.projectId}/uploads`)
    .set('X-CSRF-Token', s.csrf)
    .field('kind', 'spectrum')
    .field('targetId', String(w.targetId))
    .attach('file', Buffer.from(csv), 'spectrum.csv');
}

function csvOf(spectrum: { wavelengthM: number[]; flux: number[] }): string {
  const rows = ['wavelength_nm,flux'];
  spectrum.wavelengthM.forEach((l, i) => rows.push(`${(l * 1e9).toFixed(4)},${spectrum.flux[i].toPrecision(8)}`));
  return rows.join('\n');
}

describe('spectrum upload: the Planck fit stands on its own', () => {
  it('records the Planck temperature of a 20 000 K star seen over 400–700 nm, whose peak (145 nm by Wien) lies outside, and says why no peak is recorded', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // Planck's law with CODATA 2018 h, c, k_B; 0.5 % noise of the brightest point, the same everywhere; the generator is the test's own.
    const spectrum = syntheticSpectrum({ temperatureK: 20_000, fromM: 400e-9, toM: 700e-9, points: 301, seed: 20_000, constantNoise: 0.005 });
    const res = await uploadSpectrum(s, world, csvOf(spectrum));
    expect(res.status).toBe(201);
    const up = res.body.upload;
    expect(up.errors).toEqual([]);
    const fit = up.spectrum.fit;
    expect(Math.abs(fit.temperatureK - 20_000)).toBeLessThan(fit.temperatureSigmaK);
    expect(fit.peakWavelengthM).toBeNull();
    expect(fit.noPeakReason).toMatch(/outside the observed range/);
    // No flux column: the fit says it estimated the noise, and found it the same at every point, as it was drawn.
    expect(fit.weighted).toBe(false);
    expect(fit.noiseWords).toMatch(/no flux uncertainties given.*mostly the same at every point/);

    const done = await s.agent.post(`/api/projects/${world.projectId}/uploads/${up.id}/commit`).set('X-CSRF-Token', s.csrf).send({}).expect(200);
    expect(done.body.measurementsAdded).toBe(1);
    const m = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/measurements`).expect(200);
    const kinds = m.body.measurements.map((x: { kind: string }) => x.kind);
    expect(kinds).toEqual(['planck_temperature']);
    const planck = m.body.measurements[0];
    expect(Math.abs(planck.valueSi - 20_000)).toBeLessThan(planck.uncertaintySi);
    expect(planck.note).toMatch(/noise estimated from the scatter about the fit/);
    const d = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived`).expect(200);
    const quantities = d.body.derived.map((x: { quantity: string }) => x.quantity);
    expect(quantities).toContain('temperature_planck');
    expect(quantities).not.toContain('temperature_wien');
  });
});

describe('a long spectrum: every point fitted, only what a chart can show sent', () => {
  it('answers a 60 000-point spectrum with 1 500 points to draw and its full count, in the preview and on the sheet, while the fit used every point', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // Planck's law with CODATA 2018 h, c, k_B for a 5772 K star (IAU 2015 Resolution B3's nominal solar effective temperature), 1 % noise.
    const spectrum = syntheticSpectrum({ temperatureK: 5772, fromM: 380e-9, toM: 900e-9, points: 60_000, seed: 5772, constantNoise: 0.01 });
    const res = await uploadSpectrum(s, world, csvOf(spectrum));
    expect(res.status).toBe(201);
    const preview = res.body.upload.spectrum;
    expect(preview.pointCount).toBe(60_000);
    // Every 40th point: the smallest stride leaving at most 1 500.
    expect(preview.points).toHaveLength(1_500);
    // The file gives wavelengths to 0.1 pm (4 decimals of nm).
    expect(preview.points[0][0]).toBeCloseTo(380e-9, 12);
    expect(preview.points[1][0]).toBeCloseTo(spectrum.wavelengthM[40], 12);
    // The fit (of all the points, on the server) finds the temperature drawn.
    expect(Math.abs(preview.fit.temperatureK - 5772)).toBeLessThan(3 * preview.fit.temperatureSigmaK);
    // 1 500 pairs of numbers in JSON are about 60 kB; the 60 000 points sent whole would be about 2.4 MB.
    expect(res.text.length).toBeLessThan(200_000);

    const commit = () => s.agent.post(`/api/projects/${world!.projectId}/uploads/${res.body.upload.id}/commit`).set('X-CSRF-Token', s.csrf).send({});
    await commit().expect(200);
    // Committed once: a second commit is refused, naming why, and adds nothing.
    expect((await commit().expect(409)).body.error.message).toMatch(/already committed/);
    expect(await world.db('spectra').count({ n: '*' }).first()).toEqual({ n: 1 });
    // Its points went with the preview: a commit that raced this one finds nothing to import (a 409, not a crash).
    expect(await loadPreviewState(world.db, res.body.upload.id)).toBeNull();
    const stored = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/spectra`).expect(200);
    expect(stored.body.spectra[0].pointCount).toBe(60_000);
    expect(stored.body.spectra[0].points).toHaveLength(1_500);
    // The spectra table keeps every point.
    const row = await world.db('spectra').first('points_json');
    expect(JSON.parse(row.points_json)).toHaveLength(60_000);
  });
});
