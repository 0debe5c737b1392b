import { describe, expect, it } from 'vitest';
import { PhysicsError } from '@shared/physics/errors';
import { firstOrder, inverseVarianceMean, measured, powerLaw } from '@shared/physics/measured';
import { monteCarlo } from '@shared/physics/monte-carlo';
import { fillStandardNormals, gaussian, mulberry32, seedFor } from '@shared/physics/random';
import { combineEstimates } from '@shared/physics/derive/combine';

describe('measured values', () => {
  it('refuses NaN, Infinity and a negative σ with typed errors', () => {
    expect(() => measured(Number.NaN, 1, 'x')).toThrow(PhysicsError);
    expect(() => measured(1, Number.POSITIVE_INFINITY, 'x')).toThrow(PhysicsError);
    try {
      measured(1, -1, 'parallax');
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsError).code).toBe('negative_uncertainty');
      expect((e as PhysicsError).quantity).toBe('parallax');
    }
  });

  it('power law: (σ_y/y)² = Σ (kᵢ σᵢ / xᵢ)² (REFERENCES.md "Uncertainties"; GUM §5.1.6)', () => {
    const y = powerLaw(2, [
      { x: { value: 4, sigma: 0.4 }, power: 0.5, name: 'a' },
      { x: { value: 10, sigma: 0.2 }, power: -2, name: 'b' },
    ], 'y');
    expect(y.value).toBeCloseTo(2 * 2 * 0.01, 15);
    expect(y.sigma / y.value).toBeCloseTo(Math.hypot(0.05, 0.04), 12);
  });

  it('inverse-variance mean of 10 ± 1 and 12 ± 2 is 10.4 ± 0.894 (Bevington & Robinson §4.1)', () => {
    const c = inverseVarianceMean([{ value: 10, sigma: 1 }, { value: 12, sigma: 2 }], 't');
    expect(c.mean.value).toBeCloseTo(10.4, 12);
    expect(c.mean.sigma).toBeCloseTo(Math.sqrt(0.8), 12);
    expect(c.discordantPairs).toHaveLength(0);
    const far = inverseVarianceMean([{ value: 10, sigma: 1 }, { value: 20, sigma: 1 }], 't');
    expect(far.discordantPairs).toEqual([[0, 1]]);
  });
});

describe('seeded random numbers', () => {
  it('mulberry32 is deterministic per seed and uniform in [0, 1)', () => {
    const a = mulberry32(123);
    const b = mulberry32(123);
    let sum = 0;
    for (let i = 0; i < 10_000; i++) {
      const x = a();
      expect(x).toBe(b());
      expect(x).toBeGreaterThanOrEqual(0);
      expect(x).toBeLessThan(1);
      sum += x;
    }
    expect(sum / 10_000).toBeCloseTo(0.5, 1);
  });

  it('Box–Muller deviates have mean 0 and standard deviation 1 (Box & Muller 1958)', () => {
    const normal = gaussian(mulberry32(7));
    let s = 0;
    let s2 = 0;
    const n = 100_000;
    for (let i = 0; i < n; i++) {
      const x = normal();
      s += x;
      s2 += x * x;
    }
    expect(s / n).toBeCloseTo(0, 1);
    expect(Math.sqrt(s2 / n)).toBeCloseTo(1, 1);
  });

  it('the ziggurat stream is standard normal: mean 0, σ 1, and Φ(1), Φ(2), Φ(3) of the standard normal table (Abramowitz & Stegun 1964, Table 26.1)', () => {
    const n = 400_000;
    const z = new Float64Array(n);
    fillStandardNormals(11, z);
    let s = 0;
    let s2 = 0;
    let s4 = 0;
    const below = [0, 0, 0];
    for (const x of z) {
      s += x;
      s2 += x * x;
      s4 += x ** 4;
      for (let k = 0; k < 3; k++) if (x < k + 1) below[k]++;
    }
    // Sampling errors at n = 400 000: mean 0.0016, σ 0.0011, kurtosis (3) 0.01, each Φ at most 0.0008; bounds are four of them.
    expect(Math.abs(s / n)).toBeLessThan(0.0064);
    expect(Math.abs(Math.sqrt(s2 / n) - 1)).toBeLessThan(0.0045);
    expect(Math.abs(s4 / n - 3)).toBeLessThan(0.05);
    expect(Math.abs(below[0] / n - 0.841345)).toBeLessThan(0.0025);
    expect(Math.abs(below[1] / n - 0.97725)).toBeLessThan(0.001);
    expect(Math.abs(below[2] / n - 0.99865)).toBeLessThan(0.00025);
  });

  it('a stream depends on its seed alone: the same seed, the same deviates; a prefix is the start of a longer stream', () => {
    const a = new Float64Array(3001);
    const b = new Float64Array(5);
    const c = new Float64Array(3001);
    fillStandardNormals(7, a);
    fillStandardNormals(7, b);
    fillStandardNormals(8, c);
    expect([...b]).toEqual([...a.subarray(0, 5)]);
    expect(a.some((x, i) => x !== c[i])).toBe(true);
  });

  it('each label draws its own stream from one base seed, by FNV-1a (32-bit offset basis 2166136261, prime 16777619; from memory)', () => {
    expect(seedFor(1, 'temperature_colour')).not.toBe(seedFor(1, 'bolometric_flux'));
    expect(seedFor(2, 'temperature_colour')).not.toBe(seedFor(1, 'temperature_colour'));
    // The same hash in exact integer arithmetic: a stored σ can be reproduced only while the seeds stay what they were.
    const fnv1a = (base: number, label: string) => {
      let h = BigInt((2166136261 ^ base) >>> 0);
      for (let i = 0; i < label.length; i++) h = ((h ^ BigInt(label.charCodeAt(i))) * 16777619n) % 2n ** 32n;
      return Number(h);
    };
    for (const label of ['temperature_colour', 'bolometric_flux', 'distance_photometric']) {
      expect(seedFor(1, label)).toBe(fnv1a(1, label));
      expect(seedFor(0xffffffff, label)).toBe(fnv1a(0xffffffff, label));
    }
  });
});

describe('Monte Carlo against first order', () => {
  it('agree on a near-linear case: y = x₁ x₂² with 0.5 % inputs (JCGM 101:2008 vs GUM)', () => {
    const inputs = [{ value: 3, sigma: 0.015 }, { value: 5, sigma: 0.025 }];
    const f = (x: ArrayLike<number>) => x[0] * x[1] * x[1];
    const mc = monteCarlo(f, inputs, 'y', { samples: 40_000, seed: 11 });
    const fo = firstOrder((x) => f(x), inputs, 'y');
    const pl = powerLaw(1, [{ x: inputs[0], power: 1, name: 'a' }, { x: inputs[1], power: 2, name: 'b' }], 'y');
    expect(fo.sigma).toBeCloseTo(pl.sigma, 9);
    expect(mc.value).toBe(75);
    expect(mc.sigma / fo.sigma).toBeGreaterThan(0.98);
    expect(mc.sigma / fo.sigma).toBeLessThan(1.02);
  });

  it('counts draws outside the domain as rejected instead of clipping them', () => {
    const f = (x: ArrayLike<number>) => {
      if (x[0] <= 0) throw new PhysicsError('non_positive', 'x', 'x must be positive');
      return Math.log(x[0]);
    };
    const mc = monteCarlo(f, [{ value: 1, sigma: 1 }], 'y', { samples: 2000, seed: 1 });
    // x ≤ 0 lies 1σ below the mean: a normal distribution puts Φ(−1) = 0.1587 there (standard normal table).
    expect(mc.rejected / 2000).toBeCloseTo(0.16, 1);
    expect(Number.isFinite(mc.sigma)).toBe(true);
  });

  it('refuses when fewer than 50 draws fall inside the domain, naming the quantity', () => {
    const narrow = (x: ArrayLike<number>) => {
      if (Math.abs(x[0] - 1) > 1e-3) throw new PhysicsError('out_of_range', 'x', 'x outside its window');
      return x[0];
    };
    try {
      monteCarlo(narrow, [{ value: 1, sigma: 10 }], 'luminosity_hr', { samples: 1000 });
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsError).code).toBe('out_of_range');
      expect((e as PhysicsError).quantity).toBe('luminosity_hr');
    }
  });
});

describe('the one combination rule (Birge 1932; PDG scale factor)', () => {
  it('10 ± 0.1 and 12 ± 0.1: χ² = 200, R_B = √(χ²/(n−1)) = 14.14, a warning naming both at 14.1 σ', () => {
    const c = combineEstimates([{ value: 10, sigma: 0.1 }, { value: 12, sigma: 0.1 }], ['a', 'b'], 'parallaxes', 'distance_parallax', 'measurements_disagree');
    expect(c.value).toBeCloseTo(11, 12);
    expect(c.birgeRatio).toBeCloseTo(Math.sqrt(200), 9);
    expect(c.scale).toBeCloseTo(Math.sqrt(200), 9);
    expect(c.weights).toEqual([0.5, 0.5]);
    expect(c.warnings).toHaveLength(1);
    expect(c.warnings[0].message).toContain('a and b differ by 14.1 σ');
  });

  it('a thousand estimates in two groups: all 250 499 disagreeing pairs counted, the ten most apart named most apart first, one warning for the rest', () => {
    // 500 estimates at 10 ± 0.1 and 500 at 12 ± 0.1, one of each pair of groups nudged further out so the most apart are known.
    const estimates = Array.from({ length: 1000 }, (_, i) => ({ value: i < 500 ? 10 : 12 + (i === 999 ? 1 : 0), sigma: 0.1 }));
    const names = estimates.map((_, i) => `m${i}`);
    const c = combineEstimates(estimates, names, 'magnitudes', 'magnitude', 'measurements_disagree');
    expect(c.warnings).toHaveLength(11);
    // m999 (13) is 3 apart from each of the 500 at 10: 21.2 σ; every other cross pair is 2 apart, 14.1 σ; and m999 is
    // 1 apart (7.1 σ) from each of the other 499 at 12. 500 × 500 + 499 pairs in all.
    expect(c.warnings.slice(0, 10).every((w) => /^magnitudes: m\d+ and m999 differ by 21\.2 σ/.test(w.message))).toBe(true);
    expect(c.warnings[10].message).toBe('magnitudes: 250,489 more pairs differ by more than 3 σ (the 10 most apart are named)');
    expect(new Set(c.warnings.map((w) => w.code))).toEqual(new Set(['measurements_disagree']));
  });

  it('estimates that agree (R_B < 1) keep their σ: the scale is never below 1', () => {
    const c = combineEstimates([{ value: 10, sigma: 1 }, { value: 10.5, sigma: 1 }], ['a', 'b'], 'temperatures', 'temperature', 'temperatures_disagree');
    expect(c.birgeRatio).toBeCloseTo(Math.sqrt(0.125), 9);
    expect(c.scale).toBe(1);
    expect(c.warnings).toEqual([]);
  });
});
