import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { deriveAll, type MeasurementInput } from '@shared/physics/derive';

const NM = 1e-9;
const C = CONSTANTS.c.value;

/*
 * What the engine refuses or marks, through deriveAll: results outside the
 * published range of a law, measured zeros, and results no star can have.
 */

describe('bolometric flux from V outside the calibration of BC_V (Flower 1996, 2900–52 500 K per REFERENCES.md)', () => {
  for (const temperatureK of [1500, 200_000]) {
    it(`a ${temperatureK} K star with a V magnitude gets no flux from V but an issue naming the range`, () => {
      const measurements: MeasurementInput[] = [
        { id: 'v', kind: 'magnitude', band: 'V', valueSi: 8, uncertaintySi: 0.01 },
        { id: 't', kind: 'planck_temperature', valueSi: temperatureK, uncertaintySi: temperatureK * 0.01 },
      ];
      const graph = deriveAll(measurements, { monteCarloSamples: 200 });
      expect(graph.results.temperature?.value).toBe(temperatureK);
      expect(graph.results.bolometric_flux).toBeUndefined();
      expect(graph.issues.find((i) => i.quantity === 'bolometric_flux')).toMatchObject({ code: 'out_of_range', limit: '2900–52500 K' });
    });
  }

  it('a V magnitude so faint that the flux underflows to zero is an issue, not a value of 0 W m⁻² (IEEE 754 doubles end near 4.9e-324)', () => {
    const graph = deriveAll(
      [
        { id: 'v', kind: 'magnitude', band: 'V', valueSi: 820, uncertaintySi: 0.01 },
        { id: 't', kind: 'planck_temperature', valueSi: 5772, uncertaintySi: 50 },
      ],
      { monteCarloSamples: 200 },
    );
    expect(graph.results.bolometric_flux).toBeUndefined();
    expect(graph.issues.find((i) => i.quantity === 'bolometric_flux')).toMatchObject({ code: 'out_of_range' });
  });
});

describe('a measured zero is data: no rotation or no field detected', () => {
  const measurements: MeasurementInput[] = [
    { id: 'limb', kind: 'limb_separation', valueSi: 0, uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
    { id: 'zeeman', kind: 'zeeman_separation', valueSi: 0, uncertaintySi: 0.0001 * NM, restWavelengthSi: 525.0212 * NM, landeG: 3 },
  ];

  // σ comes from the Monte Carlo draws: at 20 000 draws the half-width is known to about 0.7 %, so 3 % is four of that.
  const draws = { monteCarloSamples: 20_000 };

  it('derives v sin i = 0 ± c σ_Δλ / (2 λ₀) and marks it an upper limit (REFERENCES.md "Rotation from the two limbs")', () => {
    const graph = deriveAll(measurements, draws);
    expect(graph.issues.filter((i) => i.quantity === 'rotation_velocity')).toEqual([]);
    const v = graph.results.rotation_velocity!;
    expect(v.value).toBe(0);
    expect(Math.abs(v.uncertainty / ((C * 0.002) / (2 * 656.279)) - 1)).toBeLessThan(0.03);
    // 0 ± 456.8 m/s: the 1σ upper limit is 0.46 km/s.
    const limit = v.warnings.find((w) => w.code === 'upper_limit');
    expect(limit?.limit).toBe('< 0.46 km s⁻¹ (1σ)');
  });

  it('derives B = 0 ± σ_Δλ / (k g λ²) and marks it an upper limit (CODATA 2018 e, m_e, c)', () => {
    const graph = deriveAll(measurements, draws);
    const b = graph.results.magnetic_field!;
    expect(b.value).toBe(0);
    // 1e-3 Å / (4.6686e-13 Å⁻¹ G⁻¹ × 3 × 5250.212² Å²) = 25.9 G.
    expect(Math.abs((b.uncertainty * 1e4) / (1e-3 / (4.6686e-13 * 3 * 5250.212 ** 2)) - 1)).toBeLessThan(0.03);
    expect(b.warnings.find((w) => w.code === 'upper_limit')?.limit).toBe('< 26 G (1σ)');
  });

  it('a clear detection (10 σ) carries no upper limit; a negative separation is still refused', () => {
    const graph = deriveAll([
      { id: 'limb', kind: 'limb_separation', valueSi: 0.02 * NM, uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
      { id: 'neg', kind: 'zeeman_separation', valueSi: -0.001 * NM, uncertaintySi: 0.0001 * NM, restWavelengthSi: 525.0212 * NM, landeG: 3 },
    ]);
    expect(graph.results.rotation_velocity!.warnings.map((w) => w.code)).not.toContain('upper_limit');
    expect(graph.results.magnetic_field).toBeUndefined();
    expect(graph.issues.find((i) => i.measurementId === 'neg')).toMatchObject({ quantity: 'magnetic_field', limit: '≥ 0' });
  });
});

describe('results that break physics are refused, implausible ones warned (limits in shared/physics/limits.ts)', () => {
  const L_SUN = CONSTANTS.L_sun.value;
  const limb = (separationM: number): MeasurementInput => ({ id: 'limb', kind: 'limb_separation', valueSi: separationM, uncertaintySi: separationM / 20, restWavelengthSi: 656.279 * NM });

  it('a limb separation of 1e300 nm would be a rotation of 2e305 m/s: refused, naming c (SI definition, exact)', () => {
    const graph = deriveAll([limb(1e300 * NM)]);
    expect(graph.results.rotation_velocity).toBeUndefined();
    // The law refuses the line itself (Δλ ≥ 2 λ₀ means v ≥ c); the limit names c either way.
    const issue = graph.issues.find((i) => i.quantity === 'rotation_velocity');
    expect(issue).toMatchObject({ code: 'unphysical', measurementId: 'limb' });
    expect(issue?.limit).toMatch(/v < c|< c = 299 792 458 m\/s/);
  });

  it('a rotation of 1500 km/s is kept with an implausible warning (the fastest measured v sin i is about 600 km/s, VFTS 102; from memory)', () => {
    // Δλ = 2 λ₀ v / c for 1500 km/s at Hα (REFERENCES.md "Rotation from the two limbs").
    const graph = deriveAll([limb((2 * 656.279 * NM * 1.5e6) / C)]);
    const v = graph.results.rotation_velocity!;
    expect(v.value).toBeCloseTo(1.5e6, 3);
    expect(v.warnings.find((w) => w.code === 'implausible')).toMatchObject({ limit: '≤ 1000 km/s' });
  });

  it('a Wien peak of 1e300 nm (T ≈ 3e-294 K) and a Planck temperature of 5e7 K are refused, naming the limits', () => {
    const graph = deriveAll([
      { id: 'peak', kind: 'peak_wavelength', valueSi: 1e300 * NM, uncertaintySi: 1e298 * NM },
      { id: 'planck', kind: 'planck_temperature', valueSi: 5e7, uncertaintySi: 1e5 },
    ]);
    expect(graph.results.temperature_wien).toBeUndefined();
    expect(graph.results.temperature_planck).toBeUndefined();
    expect(graph.results.temperature).toBeUndefined();
    expect(graph.issues.find((i) => i.quantity === 'temperature_wien')).toMatchObject({ code: 'unphysical', limit: '≥ 250 K' });
    expect(graph.issues.find((i) => i.quantity === 'temperature_planck')).toMatchObject({ code: 'unphysical', limit: '≤ 1 000 000 K' });
  });

  it('a 1500 K temperature is kept with a warning: below M9.5V, the coolest dwarf of the table at 2330 K (Pecaut & Mamajek 2013)', () => {
    const graph = deriveAll([{ id: 'planck', kind: 'planck_temperature', valueSi: 1500, uncertaintySi: 20 }]);
    expect(graph.results.temperature!.warnings.find((w) => w.code === 'implausible')).toMatchObject({ limit: '≥ 2330 K' });
  });

  it('a radius of 37 000 R☉ (10⁸ L☉ at 3000 K, Stefan–Boltzmann) is refused; 10⁸ L☉ itself only warned', () => {
    // R/R☉ = √(L/L☉) (T☉/T)² = 10⁴ × (5772/3000)² = 3.7e4 with the IAU 2015 B3 nominal values.
    const graph = deriveAll([
      { id: 'lum', kind: 'luminosity', valueSi: 1e8 * L_SUN, uncertaintySi: 1e7 * L_SUN },
      { id: 't', kind: 'planck_temperature', valueSi: 3000, uncertaintySi: 30 },
    ]);
    expect(graph.results.radius).toBeUndefined();
    expect(graph.issues.find((i) => i.quantity === 'radius')).toMatchObject({ code: 'unphysical', limit: '≤ 10 000 R☉' });
    expect(graph.results.luminosity!.warnings.find((w) => w.code === 'implausible')).toMatchObject({ limit: '≤ 10⁷ L☉' });
  });
});
