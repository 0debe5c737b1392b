import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { affectedQuantities, deriveAll, dependentsOf, dependentsOfOption, type MeasurementInput } from '@shared/physics/derive';
import { MEASUREMENT_KINDS, QUANTITY_IDS, QUANTITY_SI_UNIT } from '@shared/physics/quantities';
import { UNITS } from '@shared/physics/units';

const NM = UNITS.nm.toSi;
const MAS = UNITS.mas.toSi;
const PC = CONSTANTS.pc.value;
const L_SUN = CONSTANTS.L_sun.value;
const R_SUN = CONSTANTS.R_sun.value;

/**
 * A star like the Sun (IAU 2015 B3 nominal L☉, R☉, T☉) seen from 10 pc, with a
 * measurement of every kind. Its values follow from the nominal constants, so
 * the engine must give them back.
 */
function solarTwinAt10pc(): MeasurementInput[] {
  const flux = L_SUN / (4 * Math.PI * (10 * PC) ** 2);
  return [
    { id: 'peak', kind: 'peak_wavelength', valueSi: CONSTANTS.b.value / 5772, uncertaintySi: 10 * NM },
    { id: 'bv', kind: 'colour_index', band: 'B-V', valueSi: 0.65, uncertaintySi: 0.01 },
    { id: 'ebv', kind: 'extinction', valueSi: 0, uncertaintySi: 0.005 },
    // M_V☉ = 4.81 on Torres 2010's scale (from memory): at 10 pc the apparent magnitude is the absolute one.
    { id: 'v', kind: 'magnitude', band: 'V', valueSi: 4.81, uncertaintySi: 0.01 },
    { id: 'fbol', kind: 'bolometric_flux', valueSi: flux, uncertaintySi: 0.01 * flux },
    { id: 'plx', kind: 'parallax', valueSi: 100 * MAS, uncertaintySi: 0.1 * MAS },
    { id: 'planck', kind: 'planck_temperature', valueSi: 5772, uncertaintySi: 30 },
    { id: 'halpha', kind: 'line_wavelength', valueSi: 656.3 * NM, uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
    { id: 'limb', kind: 'limb_separation', valueSi: 0.02 * NM, uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
    { id: 'zeeman', kind: 'zeeman_separation', valueSi: 0.004 * NM, uncertaintySi: 0.001 * NM, restWavelengthSi: 525.0212 * NM, landeG: 3 },
  ];
}

describe('derivation engine', () => {
  it('derives all sixteen quantities of PRODUCT.md with their ids and SI units', () => {
    const graph = deriveAll(solarTwinAt10pc());
    expect(Object.keys(graph.results).sort()).toEqual([...QUANTITY_IDS].sort());
    for (const q of QUANTITY_IDS) {
      const r = graph.results[q]!;
      expect(r.quantity).toBe(q);
      expect(r.unit).toBe(QUANTITY_SI_UNIT[q]);
      expect(Number.isFinite(r.value)).toBe(true);
      expect(Number.isFinite(r.uncertainty)).toBe(true);
      expect(r.uncertainty).toBeGreaterThanOrEqual(0);
      expect(r.method.id).toMatch(/^[a-z0-9_]+$/);
      expect(r.method.label.length).toBeGreaterThan(5);
    }
  });

  it('gives back the Sun’s nominal values for a solar twin at 10 pc (IAU 2015 B2/B3)', () => {
    const { results } = deriveAll(solarTwinAt10pc());
    expect(results.distance_parallax!.value / PC).toBeCloseTo(10, 9);
    expect(results.luminosity!.value / L_SUN).toBeCloseTo(1, 9);
    expect(results.absolute_bolometric_magnitude!.value).toBeCloseTo(4.74, 3);
    expect(Math.abs(results.temperature!.value - 5772)).toBeLessThan(15);
    expect(results.radius!.value / R_SUN).toBeCloseTo(1, 2);
    expect(results.spectral_class!.label).toBe('G2');
    expect(results.luminosity_class!.label).toBe('main sequence (V)');
    expect(results.distance_photometric!.value / PC).toBeCloseTo(10, 0);
    expect(results.magnetic_field!.value).toBeGreaterThan(0);
  });

  it('tracks the measurements behind each value, transitively, and the constants it used', () => {
    const { results } = deriveAll(solarTwinAt10pc());
    expect(results.temperature_wien!.inputs).toEqual(['peak']);
    expect(results.temperature_wien!.constants).toEqual(['b']);
    expect(new Set(results.temperature!.inputs)).toEqual(new Set(['peak', 'bv', 'ebv', 'planck']));
    expect(new Set(results.radius!.inputs)).toEqual(new Set(['fbol', 'plx', 'peak', 'bv', 'ebv', 'planck']));
    expect(results.radius!.dependsOn).toEqual(['luminosity', 'temperature']);
    expect(results.magnetic_field!.constants).toEqual(['e', 'm_e', 'c']);
    expect(results.temperature_colour!.propagation).toBe('monte_carlo');
    expect(results.temperature_colour!.interval).toBeDefined();
  });

  it('the adopted temperature is the inverse-variance mean of the estimates (Bevington & Robinson §4.1)', () => {
    const { results } = deriveAll([
      { id: 1, kind: 'peak_wavelength', valueSi: CONSTANTS.b.value / 6000, uncertaintySi: (CONSTANTS.b.value / 6000) * (200 / 6000) },
      { id: 2, kind: 'planck_temperature', valueSi: 5900, uncertaintySi: 100 },
    ]);
    const w1 = 1 / 200 ** 2;
    const w2 = 1 / 100 ** 2;
    expect(results.temperature!.value).toBeCloseTo((6000 * w1 + 5900 * w2) / (w1 + w2), 6);
    expect(results.temperature!.uncertainty).toBeCloseTo(1 / Math.sqrt(w1 + w2), 6);
    expect(results.temperature!.warnings).toHaveLength(0);
  });

  it('warns when two temperature estimates disagree by more than 3σ, naming both and the limit', () => {
    const { results } = deriveAll([
      { id: 1, kind: 'peak_wavelength', valueSi: 400 * NM, uncertaintySi: 2 * NM },
      { id: 2, kind: 'planck_temperature', valueSi: 5000, uncertaintySi: 50 },
    ]);
    const w = results.temperature!.warnings.find((x) => x.code === 'temperatures_disagree');
    expect(w).toBeDefined();
    expect(w!.message).toContain('temperature_wien');
    expect(w!.message).toContain('temperature_planck');
    expect(w!.limit).toBe('3 σ');
    expect(results.temperature!.method.label).toContain('Birge');
  });

  it('warns on a poor parallax (σp/p > 0.2) and when the photometric and parallax distances disagree', () => {
    const star = solarTwinAt10pc().map((m) => (m.kind === 'parallax' ? { ...m, valueSi: 10 * MAS, uncertaintySi: 3 * MAS } : m));
    const { results } = deriveAll(star);
    expect(results.distance_parallax!.warnings.map((w) => w.code)).toContain('parallax_low_snr');
    const precise = solarTwinAt10pc().map((m) => (m.kind === 'parallax' ? { ...m, valueSi: 20 * MAS, uncertaintySi: 0.1 * MAS } : m));
    const crossed = deriveAll(precise).results;
    expect(crossed.distance_photometric!.warnings.map((w) => w.code)).toContain('distances_disagree');
    expect(crossed.radius!.warnings.map((w) => w.code)).toContain('radius_implausible_for_class');
  });

  it('derives the bolometric flux from V and the bolometric correction when none is measured, and warns without E(B−V)', () => {
    const star = solarTwinAt10pc().filter((m) => m.kind !== 'bolometric_flux' && m.kind !== 'extinction');
    const { results } = deriveAll(star);
    const f = results.bolometric_flux!;
    expect(f.method.id).toBe('v_magnitude_bc_flower_torres');
    expect(f.value / (L_SUN / (4 * Math.PI * (10 * PC) ** 2))).toBeCloseTo(1, 1);
    expect(f.warnings.map((w) => w.code)).toContain('extinction_assumed_zero');
    expect(f.inputs).toContain('v');
  });

  it('never throws on bad measurements: each becomes an issue naming the quantity, and the rest still derive', () => {
    const bad: MeasurementInput[] = [
      { id: 'p0', kind: 'parallax', valueSi: 0, uncertaintySi: 0 },
      { id: 'wneg', kind: 'peak_wavelength', valueSi: -5e-7, uncertaintySi: 1e-9 },
      { id: 'nan', kind: 'bolometric_flux', valueSi: Number.NaN, uncertaintySi: 0 },
      { id: 'inf', kind: 'planck_temperature', valueSi: Number.POSITIVE_INFINITY, uncertaintySi: 0 },
      { id: 'sig', kind: 'colour_index', band: 'B-V', valueSi: 0.5, uncertaintySi: -0.1 },
      { id: 'kind', kind: 'colour_temperature', valueSi: 5000, uncertaintySi: 0 },
      { id: 'hot', kind: 'planck_temperature', valueSi: 80_000, uncertaintySi: 500 },
      { id: 'g0', kind: 'zeeman_separation', valueSi: 1e-12, uncertaintySi: 0, restWavelengthSi: 5e-7, landeG: 0 },
      { id: 'rest', kind: 'line_wavelength', valueSi: 5e-7, uncertaintySi: 0 },
    ];
    const graph = deriveAll(bad);
    const byId = new Map(graph.issues.filter((i) => i.measurementId !== undefined).map((i) => [i.measurementId, i]));
    expect(byId.get('p0')).toMatchObject({ quantity: 'distance_parallax', code: 'non_positive', limit: '> 0' });
    expect(byId.get('wneg')).toMatchObject({ quantity: 'temperature_wien', code: 'non_positive' });
    expect(byId.get('nan')).toMatchObject({ quantity: 'bolometric_flux', code: 'not_finite' });
    expect(byId.get('inf')).toMatchObject({ quantity: 'temperature_planck', code: 'not_finite' });
    expect(byId.get('sig')).toMatchObject({ quantity: 'temperature_colour', code: 'negative_uncertainty' });
    expect(byId.get('kind')).toMatchObject({ quantity: null, code: 'unknown_kind' });
    expect(byId.get('g0')).toMatchObject({ quantity: 'magnetic_field', code: 'out_of_range' });
    expect(byId.get('rest')).toMatchObject({ quantity: 'radial_velocity', code: 'missing_input' });
    // 80 000 K is outside the dwarf table: no spectral class, an issue with the limit instead.
    expect(graph.results.temperature!.value).toBe(80_000);
    expect(graph.results.spectral_class).toBeUndefined();
    expect(graph.issues.find((i) => i.quantity === 'spectral_class')).toMatchObject({ code: 'out_of_range', limit: '2330–45900 K' });
  });

  it('never throws and never yields NaN or Infinity whatever it is given (property)', () => {
    const value = fc.oneof(
      fc.double(),
      fc.constantFrom(0, -0, Number.NaN, Number.POSITIVE_INFINITY, -1, 1e-300, 1e300),
      fc.double({ min: 1e-9, max: 1e-5, noNaN: true }),
      fc.double({ min: 1000, max: 60_000, noNaN: true }),
    );
    const measurement = fc.record({
      id: fc.integer(),
      kind: fc.constantFrom(...MEASUREMENT_KINDS, 'nonsense'),
      valueSi: value,
      uncertaintySi: fc.option(value, { nil: undefined }),
      band: fc.option(fc.constantFrom('V', 'B', 'B-V', 'R', ''), { nil: undefined }),
      restWavelengthSi: fc.option(value, { nil: undefined }),
      landeG: fc.option(fc.double(), { nil: undefined }),
    });
    fc.assert(
      fc.property(fc.array(measurement, { maxLength: 12 }), (list) => {
        const graph = deriveAll(list, { monteCarloSamples: 100 });
        for (const r of Object.values(graph.results)) {
          expect(Number.isFinite(r!.value)).toBe(true);
          expect(Number.isFinite(r!.uncertainty)).toBe(true);
          expect(r!.uncertainty).toBeGreaterThanOrEqual(0);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('says which quantities a measurement touches, from the graph and from the kind alone', () => {
    const graph = deriveAll(solarTwinAt10pc());
    expect(affectedQuantities(graph, 'plx')).toEqual([
      'distance_parallax',
      'luminosity',
      'radius',
      'luminosity_class',
      'luminosity_hr',
      'distance_photometric',
      'absolute_bolometric_magnitude',
    ]);
    expect(affectedQuantities(graph, 'halpha')).toEqual(['radial_velocity']);
    expect(affectedQuantities(graph, 'peak')).toContain('spectral_class');
    expect(affectedQuantities(graph, 'peak')).not.toContain('magnetic_field');
    expect(dependentsOf('zeeman_separation')).toEqual(['magnetic_field']);
    expect(dependentsOf('parallax')).toEqual(affectedQuantities(graph, 'plx'));
    expect(dependentsOf('peak_wavelength')).toContain('distance_photometric');
    expect(dependentsOfOption('assumedClass')).toEqual(expect.arrayContaining(['luminosity_hr', 'distance_photometric', 'radius']));
  });

  it('a new measurement changes nothing it does not feed: the other values stay identical to the last digit', () => {
    const before = deriveAll(solarTwinAt10pc());
    const after = deriveAll([...solarTwinAt10pc(), { id: 'hbeta', kind: 'line_wavelength', valueSi: 486.14 * NM, uncertaintySi: 0.002 * NM, restWavelengthSi: 486.135 * NM }]);
    for (const q of QUANTITY_IDS) {
      if (q === 'radial_velocity') continue;
      expect(after.results[q]!.value).toBe(before.results[q]!.value);
      expect(after.results[q]!.uncertainty).toBe(before.results[q]!.uncertainty);
    }
    expect(after.results.radial_velocity!.inputs).toEqual(['halpha', 'hbeta']);
  });

  it('combines repeated measurements by inverse-variance weighting and flags discordant ones', () => {
    const { results } = deriveAll([
      { id: 'a', kind: 'parallax', valueSi: 10 * MAS, uncertaintySi: 0.1 * MAS },
      { id: 'b', kind: 'parallax', valueSi: 12 * MAS, uncertaintySi: 0.1 * MAS },
    ]);
    expect(results.distance_parallax!.value / PC).toBeCloseTo(1000 / 11, 6);
    expect(results.distance_parallax!.warnings.map((w) => w.code)).toContain('measurements_disagree');
  });

  it('says when a measurement has no uncertainty, and when one is not used', () => {
    const graph = deriveAll([
      { id: 'p', kind: 'parallax', valueSi: 10 * MAS },
      { id: 'r', kind: 'magnitude', band: 'R', valueSi: 9, uncertaintySi: 0.01 },
    ]);
    expect(graph.results.distance_parallax!.warnings.map((w) => w.code)).toContain('uncertainty_missing');
    expect(graph.issues).toContainEqual(expect.objectContaining({ measurementId: 'r', code: 'measurement_unused', quantity: null }));
  });

  it('B−V from B and V magnitudes when no colour index is given: 8.65 − 8.0 = 0.65 gives 5778 K (Ballesteros 2012, EPL 97, 34008, worked value)', () => {
    const { results } = deriveAll([
      { id: 'B', kind: 'magnitude', band: 'B', valueSi: 8.65, uncertaintySi: 0.01 },
      { id: 'V', kind: 'magnitude', band: 'V', valueSi: 8.0, uncertaintySi: 0.01 },
    ]);
    expect(Math.abs(results.temperature_colour!.value - 5778)).toBeLessThan(3);
    expect(results.temperature_colour!.inputs).toEqual(['B', 'V']);
  });
});
