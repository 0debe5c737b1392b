import { describe, expect, it } from 'vitest';
import { bolometricFluxFromV, bolometricFluxFromVWm2 } from '@shared/physics/bolometric-correction';
import { ballesterosTemperatureK, colourTemperature } from '@shared/physics/colour-temperature';
import { CONSTANTS } from '@shared/physics/constants';
import { DwarfColumn, interpolateDwarfColumn } from '@shared/physics/dwarf-table';
import { FAST_LOG10_ERROR, Log10Grid } from '@shared/physics/fast-log10';
import { PhysicsError } from '@shared/physics/errors';
import {
  ASSUMED_CLASS_MODELS,
  assumedClassLogLuminosity,
  assumedClassLuminosity,
  LUMINOSITY_CLASSES,
  photometricDistance,
} from '@shared/physics/main-sequence';
import { monteCarlo, type MonteCarloResult } from '@shared/physics/monte-carlo';
import { mulberry32 } from '@shared/physics/random';

/**
 * The laws' Monte Carlo draws are ranked by cheap numbers and valued only
 * where the interval is read (DrawModel). These tests hold them to the
 * plain propagation, which calls each law's checked function once per
 * draw: the numbers must agree to the last digit (JCGM 101:2008 fixes the
 * procedure; the speed-up must not change its outcome).
 */

const L_SUN = CONSTANTS.L_sun.value;

function sameNumbers(fast: MonteCarloResult, plain: MonteCarloResult): void {
  expect(fast.value).toBe(plain.value);
  expect(fast.low).toBe(plain.low);
  expect(fast.high).toBe(plain.high);
  expect(fast.sigma).toBe(plain.sigma);
  expect(fast.accepted).toBe(plain.accepted);
  expect(fast.rejected).toBe(plain.rejected);
}

describe('Monte Carlo with a draw model', () => {
  const inputs = [
    { value: 1, sigma: 0.3 },
    { value: 2, sigma: 0 },
    { value: -0.5, sigma: 0.2 },
  ];
  const f = (x: ArrayLike<number>) => Math.exp(x[0] + x[2]) + x[1];

  it('settles coarse ranks by the values: the interval is the plain one to the last digit', () => {
    const plain = monteCarlo(f, inputs, 'y', { samples: 2000, seed: 3 });
    // Ranks rounded to 0.02: many draws tie, so most order statistics are settled by their values.
    const step = 0.02;
    const fast = monteCarlo(f, inputs, 'y', { samples: 2000, seed: 3 }, {
      rank: (draws) => {
        for (let s = 0; s < draws.count; s++) draws.keep(s, Math.round((draws.input(0, s) + draws.input(2, s)) / step) * step);
      },
      rankError: step / 2 + 1e-12,
      value: (x) => f(x),
    });
    sameNumbers(fast, plain);
  });

  it('counts a rank of NaN as a rejected draw, as a throw in f', () => {
    const g = (x: ArrayLike<number>) => {
      if (x[0] < 0.8) throw new PhysicsError('out_of_range', 'y', 'outside the model');
      return x[0] * x[0];
    };
    const guarded = (x: ArrayLike<number>) => (x[0] < 0.8 ? Number.NaN : g(x));
    const plain = monteCarlo(g, inputs, 'y', { samples: 1000, seed: 5 });
    const fast = monteCarlo(guarded, inputs, 'y', { samples: 1000, seed: 5 }, {
      rank: (draws) => {
        for (let s = 0; s < draws.count; s++) {
          const a = draws.input(0, s);
          draws.keep(s, a < 0.8 ? Number.NaN : a);
        }
      },
      rankError: 0,
      value: guarded,
    });
    expect(fast.value).toBe(g([1, 2, -0.5]));
    expect(plain.rejected).toBeGreaterThan(100);
    sameNumbers(fast, plain);
  });
});

describe('the fast logarithm (Tang 1990, table-driven)', () => {
  it('stays within its stated error of Math.log10, inside the grid and outside it', () => {
    const grid = new Log10Grid(2000, 50_000, 15);
    const uniform = mulberry32(11);
    for (let i = 0; i < 20_000; i++) {
      const inside = 2000 + 48_000 * uniform();
      const anywhere = Math.exp((uniform() - 0.5) * 1400);
      expect(Math.abs(grid.log10(inside) - Math.log10(inside))).toBeLessThan(FAST_LOG10_ERROR);
      expect(Math.abs(grid.log10(anywhere) - Math.log10(anywhere))).toBeLessThan(FAST_LOG10_ERROR);
    }
    expect(grid.log10(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(grid.log10(-1)).toBeNaN();
  });

  it('refuses a grid too coarse for its series', () => {
    expect(() => new Log10Grid(100, 200, 1)).toThrow(RangeError);
  });
});

describe('a dwarf-table column for draws (Pecaut & Mamajek 2013, Table 5)', () => {
  const column = new DwarfColumn((row) => row.logLLsun);
  const uniform = mulberry32(17);

  it('reads the same numbers as interpolateDwarfColumn inside the table and NaN outside', () => {
    for (let i = 0; i < 5000; i++) {
      const t = 2330 + (45_900 - 2330) * uniform();
      expect(column.unchecked(t)).toBe(interpolateDwarfColumn(t, (row) => row.logLLsun, 'luminosity_hr'));
    }
    expect(column.unchecked(2329.9)).toBeNaN();
    expect(column.unchecked(45_900.1)).toBeNaN();
    expect(column.fast(2329.9)).toBeNaN();
    expect(column.fast(-5)).toBeNaN();
  });

  it('ranks within its stated error of the exact reading, under 10⁻⁶ dex', () => {
    expect(column.fastError).toBeLessThan(1e-6);
    for (let i = 0; i < 20_000; i++) {
      const t = 2330 + (45_900 - 2330) * uniform();
      expect(Math.abs(column.fast(t) - column.unchecked(t))).toBeLessThanOrEqual(column.fastError);
    }
    expect(column.fast(45_900)).toBe(column.unchecked(45_900));
  });
});

describe('the laws’ Monte Carlo draws against the plain propagation, to the last digit', () => {
  const options = { samples: 1000, seed: 29 };

  it('colour temperature (Ballesteros 2012), including draws across the singular colour', () => {
    for (const [colour, excess] of [
      [{ value: 0.65, sigma: 0.02 }, { value: 0.03, sigma: 0.01 }],
      [{ value: -0.6, sigma: 0.1 }, { value: 0, sigma: 0 }],
    ]) {
      const fast = colourTemperature(colour, excess, options).temperatureK;
      sameNumbers(fast, monteCarlo((x) => ballesterosTemperatureK(x[0] - x[1]), [colour, excess], 'temperature_colour', options));
    }
  });

  it('bolometric flux from V (Flower 1996; Torres 2010; IAU 2015 B2)', () => {
    const v = { value: 6.1, sigma: 0.03 };
    const excess = { value: 0.05, sigma: 0.01 };
    for (const t of [{ value: 5800, sigma: 80 }, { value: 30_000, sigma: 4000 }, { value: 3200, sigma: 900 }]) {
      const fast = bolometricFluxFromV(v, t, excess, 3.1, options).fluxWm2;
      sameNumbers(fast, monteCarlo((x) => bolometricFluxFromVWm2(x[0], x[1], x[2], 3.1), [v, t, excess], 'bolometric_flux', options));
    }
  });

  it('assumed-class luminosity and photometric distance, every class, near the table’s edges too', () => {
    const flux = { value: 2e-10, sigma: 3e-11 };
    for (const assumedClass of LUMINOSITY_CLASSES) {
      for (const t of [{ value: 5800, sigma: 60 }, { value: 44_000, sigma: 2500 }, { value: 2500, sigma: 150 }]) {
        const scatter = { value: 0, sigma: ASSUMED_CLASS_MODELS[assumedClass].scatterDex };
        const luminosity = (x: ArrayLike<number>) => L_SUN * Math.pow(10, assumedClassLogLuminosity(x[0], assumedClass, x[1]));
        sameNumbers(assumedClassLuminosity(t, assumedClass, options), monteCarlo(luminosity, [t, scatter], 'luminosity_hr', options));
        const distance = (x: ArrayLike<number>) => {
          if (!(x[2] > 0)) throw new PhysicsError('non_positive', 'bolometric_flux', 'flux must be positive');
          return Math.sqrt(luminosity(x) / (4 * Math.PI * x[2]));
        };
        sameNumbers(photometricDistance(t, assumedClass, flux, options), monteCarlo(distance, [t, scatter, flux], 'distance_photometric', options));
      }
    }
  });
});
