import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { deriveAll, dependentsOf } from '@shared/physics/derive';
import { isMeasurementKind, MEASUREMENT_SI_UNIT } from '@shared/physics/quantities';
import { readMeasurementRecords, suggestMapping, FILE_QUANTITIES } from '@shared/file-reading/measurement-file';
import { allowedUnits, measurementToSi } from '@shared/physics/units';

/*
 * A distance or a luminosity known from elsewhere (a cluster's distance, a
 * standard candle's luminosity) entered as a measurement. Factors checked
 * against the published definitions, not the project's constants table:
 * 1 pc = 648 000/π au with 1 au = 149 597 870 700 m (IAU 2015 B2, IAU 2012 B2);
 * 1 ly = 365.25 × 86 400 s × 299 792 458 m/s (IAU Julian year, SI c);
 * L☉ = 3.828e26 W, R☉ = 6.957e8 m, T☉ = 5772 K (IAU 2015 B3);
 * σ = 5.670 374 419e-8 W m⁻² K⁻⁴ (CODATA 2018).
 */
const PC_M = (648_000 / Math.PI) * 149_597_870_700;
const LY_M = 365.25 * 86_400 * 299_792_458;
const L_SUN_W = 3.828e26;
const R_SUN_M = 6.957e8;
const SIGMA_SB = 5.670_374_419e-8;
/** Draws per derivation here: σ read from 4000 draws scatters by about 0.96/√4000 ≈ 1.5 % of itself (JCGM 101:2008 §7.9, from memory). */
const SAMPLES = 4000;
/** σ from the draws against the first-order σ, within 4 × 1.5 %. */
const closeSigma = (engine: number, firstOrder: number) => expect(Math.abs(engine / firstOrder - 1)).toBeLessThan(0.06);

describe('distance and luminosity as measurement kinds', () => {
  it('are kinds of the measurement file, stored in m and W', () => {
    expect(isMeasurementKind('distance')).toBe(true);
    expect(isMeasurementKind('luminosity')).toBe(true);
    expect(FILE_QUANTITIES).toEqual(expect.arrayContaining(['distance', 'luminosity']));
    expect(MEASUREMENT_SI_UNIT).toMatchObject({ distance: 'm', luminosity: 'W' });
  });

  it('a distance is given in pc, kpc, ly or m and converts by the IAU definitions', () => {
    expect(allowedUnits('distance')).toEqual(expect.arrayContaining(['pc', 'kpc', 'ly', 'm']));
    expect(measurementToSi('distance', 2.5, 'kpc', 0.1).valueSi / (2500 * PC_M)).toBeCloseTo(1, 14);
    expect(measurementToSi('distance', 2.5, 'kpc', 0.1).uncertaintySi / (100 * PC_M)).toBeCloseTo(1, 14);
    expect(measurementToSi('distance', 10, 'pc').valueSi / (10 * PC_M)).toBeCloseTo(1, 14);
    expect(measurementToSi('distance', 4.24, 'ly').valueSi / (4.24 * LY_M)).toBeCloseTo(1, 14);
    expect(measurementToSi('distance', 3e17, 'm').valueSi).toBe(3e17);
    expect(() => measurementToSi('distance', 10, 'nm')).toThrow(/not allowed for distance/);
    expect(() => measurementToSi('distance', 10, 'mas')).toThrow(/not allowed for distance/);
  });

  it('a luminosity is given in W or in L☉, written Lsun or L☉, with L☉ = 3.828e26 W (IAU 2015 B3)', () => {
    expect(allowedUnits('luminosity')).toEqual(expect.arrayContaining(['W', 'L_sun']));
    expect(measurementToSi('luminosity', 2, 'Lsun').valueSi).toBeCloseTo(2 * L_SUN_W, -14);
    expect(measurementToSi('luminosity', 2, 'L☉').valueSi).toBeCloseTo(2 * L_SUN_W, -14);
    expect(measurementToSi('luminosity', 2, ' L☉ ', 0.5).uncertaintySi).toBeCloseTo(0.5 * L_SUN_W, -14);
    expect(measurementToSi('luminosity', 7.656e26, 'W').valueSi).toBe(7.656e26);
    expect(() => measurementToSi('luminosity', 1, 'W/m2')).toThrow(/not allowed for luminosity/);
  });

  it('the file reads them in the long layout and guesses them in the wide one', () => {
    const headers = ['target', 'quantity', 'value', 'uncertainty', 'unit'];
    const { rows, errors } = readMeasurementRecords(
      headers,
      [
        ['GW 7', 'distance', '1.2', '0.1', 'kpc'],
        ['GW 7', 'luminosity', '35', '3', 'Lsun'],
        ['GW 7', 'luminosity', '0', '3', 'Lsun'],
      ],
      suggestMapping(headers),
    );
    expect(rows.map((r) => r.kind)).toEqual(['distance', 'luminosity']);
    expect(rows[0].valueSi / (1200 * PC_M)).toBeCloseTo(1, 14);
    expect(rows[1].valueSi / (35 * L_SUN_W)).toBeCloseTo(1, 14);
    expect(errors).toMatchObject([{ row: 4, column: 'value' }]);
    const wide = suggestMapping(['target', 'distance_pc', 'distance_pc_err', 'luminosity_lsun']);
    expect(wide.columns.distance_pc).toMatchObject({ role: 'measurement', quantity: 'distance', unit: 'pc' });
    expect(wide.columns.distance_pc_err).toMatchObject({ role: 'uncertainty', of: 'distance_pc' });
    expect(wide.columns.luminosity_lsun).toMatchObject({ role: 'measurement', quantity: 'luminosity', unit: 'Lsun' });
  });
});

describe('the graph uses a given distance or luminosity, with provenance', () => {
  it('radius from a given L and T: 1 L☉ at 5772 K is 1 R☉ (Stefan–Boltzmann with the IAU 2015 B3 nominal values, to 3e-6)', () => {
    const graph = deriveAll([
      { id: 'lum', kind: 'luminosity', valueSi: L_SUN_W, uncertaintySi: 0.02 * L_SUN_W },
      { id: 't', kind: 'planck_temperature', valueSi: 5772, uncertaintySi: 10 },
    ], { monteCarloSamples: SAMPLES });
    const luminosity = graph.results.luminosity!;
    expect(luminosity.value).toBe(L_SUN_W);
    expect(luminosity.method.label).toMatch(/given/);
    expect(luminosity.inputs).toEqual(['lum']);
    const radius = graph.results.radius!;
    const expected = Math.sqrt(L_SUN_W / (4 * Math.PI * SIGMA_SB * 5772 ** 4));
    expect(Math.abs(expected / R_SUN_M - 1)).toBeLessThan(3e-6);
    expect(radius.value / expected).toBeCloseTo(1, 12);
    // (σ_R/R)² = (σ_L/2L)² + (2σ_T/T)² (REFERENCES.md, product of powers).
    closeSigma(radius.uncertainty / radius.value, Math.hypot(0.01, (2 * 10) / 5772));
    expect(radius.inputs).toEqual(expect.arrayContaining(['lum', 't']));
    expect(graph.issues.filter((i) => i.code === 'measurement_unused')).toEqual([]);
  });

  it('a given luminosity is used as entered even beside a flux, and rests on nothing else (its inputs are its own)', () => {
    const flux = L_SUN_W / (4 * Math.PI * (10 * PC_M) ** 2);
    const graph = deriveAll([
      { id: 'lum', kind: 'luminosity', valueSi: 2 * L_SUN_W, uncertaintySi: 0.1 * L_SUN_W },
      { id: 'f', kind: 'bolometric_flux', valueSi: flux, uncertaintySi: 0.01 * flux },
    ]);
    expect(graph.results.luminosity).toMatchObject({ value: 2 * L_SUN_W, inputs: ['lum'], dependsOn: [] });
    // The distance from it: d = √(L / 4πF) = √2 × 10 pc.
    expect(graph.results.distance_photometric!.value / (Math.SQRT2 * 10 * PC_M)).toBeCloseTo(1, 12);
  });

  it('luminosity from a given distance and the measured flux: L☉ / 4π(10 pc)² at 10 pc gives back L☉ (inverse-square law)', () => {
    const flux = L_SUN_W / (4 * Math.PI * (10 * PC_M) ** 2);
    const graph = deriveAll([
      { id: 'd', kind: 'distance', valueSi: 10 * PC_M, uncertaintySi: 0.5 * PC_M },
      { id: 'f', kind: 'bolometric_flux', valueSi: flux, uncertaintySi: 0.01 * flux },
    ], { monteCarloSamples: SAMPLES });
    const luminosity = graph.results.luminosity!;
    expect(luminosity.value / L_SUN_W).toBeCloseTo(1, 12);
    // (σ_L/L)² = (2σ_d/d)² + (σ_F/F)².
    closeSigma(luminosity.uncertainty / luminosity.value, Math.hypot(2 * 0.05, 0.01));
    expect(luminosity.method.label).toMatch(/given distance/);
    expect(luminosity.inputs).toEqual(expect.arrayContaining(['d', 'f']));
  });

  it('distance from a given L and the measured flux (the inverse-square route): d = √(L / 4πF) = 10 pc', () => {
    const flux = L_SUN_W / (4 * Math.PI * (10 * PC_M) ** 2);
    const graph = deriveAll([
      { id: 'lum', kind: 'luminosity', valueSi: L_SUN_W, uncertaintySi: 0.04 * L_SUN_W },
      { id: 'f', kind: 'bolometric_flux', valueSi: flux, uncertaintySi: 0.01 * flux },
      { id: 't', kind: 'planck_temperature', valueSi: 5772, uncertaintySi: 10 },
    ], { monteCarloSamples: SAMPLES });
    const d = graph.results.distance_photometric!;
    expect(d.value / (10 * PC_M)).toBeCloseTo(1, 12);
    // (σ_d/d)² = (σ_L/2L)² + (σ_F/2F)².
    closeSigma(d.uncertainty / d.value, Math.hypot(0.02, 0.005));
    expect(d.method.label).toMatch(/given luminosity/);
    expect(d.inputs).toEqual(expect.arrayContaining(['lum', 'f']));
  });

  it('a new distance or luminosity re-derives what rests on it', () => {
    expect(dependentsOf('distance')).toEqual(expect.arrayContaining(['luminosity', 'radius', 'absolute_bolometric_magnitude']));
    expect(dependentsOf('luminosity')).toEqual(expect.arrayContaining(['luminosity', 'radius', 'distance_photometric']));
  });
});

// The IAU constants the project holds agree with the definitions above.
describe('the project constants behind the conversions', () => {
  it('pc and L☉', () => {
    expect(CONSTANTS.pc.value / PC_M).toBeCloseTo(1, 14);
    expect(CONSTANTS.L_sun.value).toBe(L_SUN_W);
  });
});
