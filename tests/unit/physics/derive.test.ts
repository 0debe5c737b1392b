import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { affectedQuantities, deriveAll, dependentsOf, dependentsOfOption, QUANTITY_DEPENDENCIES, type MeasurementInput } from '@shared/physics/derive';
import { DERIVATION_NODES } from '@shared/physics/derive/nodes';
import { MEASUREMENT_KINDS, QUANTITY_IDS, QUANTITY_SI_UNIT } from '@shared/physics/quantities';
import { UNITS } from '@shared/physics/units';
import { targetSeed } from '@shared/physics/random';
import { formatResult } from '@shared/physics/display';
import { bolometricFluxFromVWm2 } from '@shared/physics/bolometric-correction';
import { ballesterosTemperatureK } from '@shared/physics/colour-temperature';
import { ASSUMED_CLASS_MODELS, mainSequenceLogLuminosity } from '@shared/physics/main-sequence';
import { normalDeviates } from '../../support/reference-random';

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
  });

  it('the adopted temperature is the inverse-variance mean of the estimates (Bevington & Robinson §4.1)', () => {
    const { results } = deriveAll([
      { id: 1, kind: 'peak_wavelength', valueSi: CONSTANTS.b.value / 6000, uncertaintySi: (CONSTANTS.b.value / 6000) * (200 / 6000) },
      { id: 2, kind: 'planck_temperature', valueSi: 5900, uncertaintySi: 100 },
    ]);
    const w1 = 1 / 200 ** 2;
    const w2 = 1 / 100 ** 2;
    // The weights are the estimates' σ as their draws give them (3 % sampling error at 1000 draws), so the mean is within 1 % of σ and σ within 10 %.
    expect(Math.abs(results.temperature!.value - (6000 * w1 + 5900 * w2) / (w1 + w2))).toBeLessThan(1);
    expect(results.temperature!.uncertainty / (1 / Math.sqrt(w1 + w2))).toBeCloseTo(1, 1);
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

  it('one graph: what each result rests on, the dependency table and the refusals all read the table of nodes', () => {
    const graph = deriveAll(solarTwinAt10pc());
    for (const q of QUANTITY_IDS) {
      const r = graph.results[q]!;
      for (const d of [...r.dependsOn, ...r.checkedAgainst]) expect(QUANTITY_DEPENDENCIES[q].quantities).toContain(d);
    }
    // The photometric distance rests on the assumed-class luminosity and the flux, and so on every temperature and flux input.
    expect(QUANTITY_DEPENDENCIES.distance_photometric.quantities).toEqual(expect.arrayContaining(['luminosity_hr', 'bolometric_flux', 'distance_parallax']));
    for (const kind of ['peak_wavelength', 'colour_index', 'magnitude', 'bolometric_flux', 'planck_temperature'] as const) {
      expect(dependentsOf(kind)).toContain('distance_photometric');
    }
    expect(new Set(DERIVATION_NODES.map((n) => n.quantity))).toEqual(new Set(QUANTITY_IDS));
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

/*
 * An independent Monte Carlo, written here with its own plain generator
 * (mulberry32 and Box–Muller, as published; not the engine's code): every
 * raw measurement is drawn once per draw and the chain is computed draw by
 * draw with the project's point laws (checked against published values in
 * their own tests). σ is half the central 68.27 % interval (type-7
 * percentiles), as the engine defines it.
 *
 * Tolerance: the half-width read from n draws scatters by about 0.96/√n of
 * itself; with n = 20 000 for the engine and 100 000 here the ratio of the
 * two scatters by some 0.75 %, so 4 % is five of its σ, while the
 * independent-input propagation this replaces was off by 0.7–1.75×.
 */

/** 15.87th and 84.13th type-7 percentiles of the finite values, and half their distance. */
function referenceInterval(values: number[]): { low: number; high: number; sigma: number } {
  const v = values.filter(Number.isFinite).sort((x, y) => x - y);
  const at = (p: number) => {
    const h = p * (v.length - 1);
    const k = Math.floor(h);
    return v[k] + (v[Math.min(k + 1, v.length - 1)] - v[k]) * (h - k);
  };
  const low = at(0.158655);
  const high = at(0.841345);
  return { low, high, sigma: (high - low) / 2 };
}

const REFERENCE_DRAWS = 20_000;
/** The independent Monte Carlo of the chain takes more draws, so that its own sampling error (0.3 %) is small beside the engine's. */
const INDEPENDENT_DRAWS = 100_000;

describe('correlated Monte Carlo through the whole graph (issue 8, defect 1)', () => {
  // A reddened star: E(B−V) = 0.3 ± 0.05 feeds both the colour temperature
  // and the flux from V, so L, R, the photometric distance and the class
  // offset all carry the same E(B−V) and T draws.
  const star: MeasurementInput[] = [
    { id: 'bv', kind: 'colour_index', band: 'B-V', valueSi: 0.95, uncertaintySi: 0.02 },
    { id: 'ebv', kind: 'extinction', valueSi: 0.3, uncertaintySi: 0.05 },
    { id: 'v', kind: 'magnitude', band: 'V', valueSi: 8, uncertaintySi: 0.02 },
    { id: 'plx', kind: 'parallax', valueSi: 10 * MAS, uncertaintySi: 0.2 * MAS },
  ];
  const graph = deriveAll(star, { monteCarloSamples: REFERENCE_DRAWS, seed: 8 });
  const normal = normalDeviates(2024);
  const draws = { luminosity: [] as number[], radius: [] as number[], distance_photometric: [] as number[], luminosity_class: [] as number[], temperature: [] as number[] };
  const scatter = ASSUMED_CLASS_MODELS.main_sequence.scatterDex;
  for (let s = 0; s < INDEPENDENT_DRAWS; s++) {
    const bv = 0.95 + 0.02 * normal();
    const ebv = 0.3 + 0.05 * normal();
    const v = 8 + 0.02 * normal();
    const p = (10 + 0.2 * normal()) * MAS;
    const spread = scatter * normal();
    const t = ballesterosTemperatureK(bv - ebv);
    const f = bolometricFluxFromVWm2(v, t, ebv, 3.1);
    const d = CONSTANTS.au.value / p;
    const l = 4 * Math.PI * d * d * f;
    draws.temperature.push(t);
    draws.luminosity.push(l);
    draws.radius.push(Math.sqrt(l / (4 * Math.PI * CONSTANTS.sigma.value * t ** 4)));
    draws.luminosity_class.push(Math.log10(l / L_SUN) - mainSequenceLogLuminosity(t));
    const lHr = L_SUN * 10 ** (mainSequenceLogLuminosity(t) + spread);
    draws.distance_photometric.push(Math.sqrt(lHr / (4 * Math.PI * f)));
  }

  for (const q of ['temperature', 'luminosity', 'radius', 'distance_photometric', 'luminosity_class'] as const) {
    it(`σ of ${q} matches the independent Monte Carlo over the raw measurements within 4 %`, () => {
      const reference = referenceInterval(draws[q]);
      const engine = graph.results[q]!;
      expect(engine.uncertainty / reference.sigma).toBeGreaterThan(0.96);
      expect(engine.uncertainty / reference.sigma).toBeLessThan(1.04);
    });
  }

  it('a Wien peak and a Planck fit of one spectrum count once: the adopted σ is not shrunk as if they were independent', () => {
    // 5800 K ± 100 K from each reading. Independent: 100/√2 = 71 K; one spectrum (full correlation): 100 K.
    const lambda = CONSTANTS.b.value / 5800;
    const sigmaLambda = lambda * (100 / 5800);
    const readings: MeasurementInput[] = [
      { id: 'peak', kind: 'peak_wavelength', valueSi: lambda, uncertaintySi: sigmaLambda, spectrumId: 's1' },
      { id: 'fit', kind: 'planck_temperature', valueSi: 5800, uncertaintySi: 100, spectrumId: 's1' },
    ];
    const one = deriveAll(readings, { monteCarloSamples: REFERENCE_DRAWS }).results.temperature!;
    expect(one.uncertainty / 100).toBeGreaterThan(0.96);
    expect(one.uncertainty / 100).toBeLessThan(1.04);
    const two = deriveAll(
      readings.map((m) => ({ ...m, spectrumId: m.id })),
      { monteCarloSamples: REFERENCE_DRAWS },
    ).results.temperature!;
    expect(two.uncertainty / (100 / Math.SQRT2)).toBeGreaterThan(0.96);
    expect(two.uncertainty / (100 / Math.SQRT2)).toBeLessThan(1.04);
  });
});

describe('each target its own reproducible Monte Carlo stream (issue 8, defect 2)', () => {
  const star = solarTwinAt10pc().filter((m) => m.kind !== 'parallax');

  it('a re-run with the same seed gives the same digits; another target’s seed gives other draws', () => {
    // The server's seeds: one per target of a project, the same at every re-run.
    expect(targetSeed(1, 7)).toBe(targetSeed(1, 7));
    expect(new Set([targetSeed(1, 7), targetSeed(1, 8), targetSeed(2, 7)]).size).toBe(3);
    const a = deriveAll(star, { seed: targetSeed(1, 7) });
    const again = deriveAll(star, { seed: targetSeed(1, 7) });
    const b = deriveAll(star, { seed: targetSeed(1, 8) });
    for (const q of QUANTITY_IDS) {
      if (!a.results[q]) continue;
      expect(again.results[q]!.uncertainty).toBe(a.results[q]!.uncertainty);
    }
    expect(b.results.luminosity_hr!.uncertainty).not.toBe(a.results.luminosity_hr!.uncertainty);
  });

  it('over many targets the assumed-class luminosity’s σ scatters about the independent Monte Carlo’s, not about one shared bias', () => {
    const t = { value: 5772, sigma: 23 };
    const normal = normalDeviates(7);
    const values: number[] = [];
    for (let s = 0; s < 200_000; s++) values.push(L_SUN * 10 ** (mainSequenceLogLuminosity(t.value + t.sigma * normal()) + 0.15 * normal()));
    const reference = referenceInterval(values).sigma;
    const sigmas = Array.from({ length: 40 }, (_, n) =>
      deriveAll([{ id: 'fit', kind: 'planck_temperature', valueSi: t.value, uncertaintySi: t.sigma }], { seed: 1000 + n }).results.luminosity_hr!.uncertainty,
    );
    expect(new Set(sigmas).size).toBe(40);
    const mean = sigmas.reduce((x, y) => x + y, 0) / sigmas.length;
    // 40 targets of 1000 draws: the mean σ is known to about 3 %/√40 = 0.5 %; 2 % is four of that.
    expect(Math.abs(mean / reference - 1)).toBeLessThan(0.02);
  });
});

describe('one inverse-variance combination with the disagreement warning and the Birge ratio (issue 8, defect 6)', () => {
  it('parallaxes 10 ± 0.1 and 12 ± 0.1 mas: p = 11 ± 1.0 mas (R_B = √200 = 14.1, Birge 1932), so d runs from 83.3 to 100 pc, not ± 0.58 pc', () => {
    const { results } = deriveAll(
      [
        { id: 'a', kind: 'parallax', valueSi: 10 * MAS, uncertaintySi: 0.1 * MAS },
        { id: 'b', kind: 'parallax', valueSi: 12 * MAS, uncertaintySi: 0.1 * MAS },
      ],
      { monteCarloSamples: REFERENCE_DRAWS },
    );
    const d = results.distance_parallax!;
    expect(d.value / PC).toBeCloseTo(1000 / 11, 6);
    // p ~ N(11, 1) mas gives the 68 % interval 1000/12 to 1000/10 pc, σ = 8.33 pc.
    expect(d.uncertainty / PC / 8.333).toBeGreaterThan(0.96);
    expect(d.uncertainty / PC / 8.333).toBeLessThan(1.04);
    const w = d.warnings.find((x) => x.code === 'measurements_disagree')!;
    expect(w.message).toMatch(/14\.1 σ/);
    expect(w.message).toMatch(/Birge ratio 14\.14/);
  });

  it('Planck temperatures 5000 ± 50 and 5600 ± 50 K: 5300 ± 300 K (R_B = √72 = 8.49), not ± 35 K', () => {
    const { results } = deriveAll(
      [
        { id: 'a', kind: 'planck_temperature', valueSi: 5000, uncertaintySi: 50 },
        { id: 'b', kind: 'planck_temperature', valueSi: 5600, uncertaintySi: 50 },
      ],
      { monteCarloSamples: REFERENCE_DRAWS },
    );
    for (const q of ['temperature_planck', 'temperature'] as const) {
      expect(results[q]!.value).toBeCloseTo(5300, 6);
      expect(results[q]!.uncertainty / 300).toBeGreaterThan(0.96);
      expect(results[q]!.uncertainty / 300).toBeLessThan(1.04);
    }
    expect(results.temperature_planck!.warnings.map((w) => w.code)).toContain('measurements_disagree');
    expect(results.temperature_planck!.method.label === 'least-squares Planck fit to a flux-calibrated spectrum').toBe(true);
  });
});

describe('the asymmetric 68 % interval where the draws are skewed (issue 8, defect 8)', () => {
  it('distance from p = 10 ± 5 mas: 100 pc with the draws’ interval 66 to 186 pc (−34/+86), as the independent Monte Carlo finds', () => {
    const { results } = deriveAll([{ id: 'p', kind: 'parallax', valueSi: 10 * MAS, uncertaintySi: 5 * MAS }], { monteCarloSamples: REFERENCE_DRAWS });
    const normal = normalDeviates(99);
    const values: number[] = [];
    for (let s = 0; s < REFERENCE_DRAWS; s++) {
      const p = 10 + 5 * normal();
      // A draw at or below 0 mas gives no distance: left out, as the engine leaves it out.
      values.push(p > 0 ? 1000 / p : Number.NaN);
    }
    const reference = referenceInterval(values);
    const d = results.distance_parallax!;
    expect(d.value / PC).toBeCloseTo(100, 9);
    expect(d.interval).toBeDefined();
    expect(d.interval!.low / PC / reference.low).toBeCloseTo(1, 1);
    expect(d.interval!.high / PC / reference.high).toBeCloseTo(1, 1);
    expect(Math.abs(d.interval!.low / PC / reference.low - 1)).toBeLessThan(0.03);
    expect(Math.abs(d.interval!.high / PC / reference.high - 1)).toBeLessThan(0.04);
    expect(d.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['parallax_low_snr', 'monte_carlo_rejected']));
  });

  it('the sheet’s line shows the interval as +x/−y: 100 +85/−34 pc at the default 1000 draws', () => {
    const { results } = deriveAll([{ id: 'p', kind: 'parallax', valueSi: 10 * MAS, uncertaintySi: 5 * MAS }]);
    expect(formatResult(results.distance_parallax!).values[0].text).toMatch(/^100 \+8\d\/−3\d pc$/);
  });

  it('a precise, nearly linear result carries no interval: σ says it all', () => {
    const { results } = deriveAll(solarTwinAt10pc());
    expect(results.distance_parallax!.interval).toBeUndefined();
    expect(results.radial_velocity!.interval).toBeUndefined();
  });
});
