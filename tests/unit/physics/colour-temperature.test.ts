import { describe, expect, it } from 'vitest';
import { ballesterosTemperatureK, colourTemperature } from '@shared/physics/colour-temperature';
import { PhysicsError } from '@shared/physics/errors';
import { firstOrder } from '@shared/physics/measured';

describe('colour temperature (Ballesteros 2012)', () => {
  it("B−V = 0.65 gives 5778 K, Ballesteros's own worked value (EPL 97, 34008)", () => {
    expect(Math.abs(ballesterosTemperatureK(0.65) - 5778)).toBeLessThan(3);
  });

  it('saturates for hot stars: B−V = −0.32 gives about 17 400 K (REFERENCES.md, Ballesteros relation)', () => {
    expect(Math.abs(ballesterosTemperatureK(-0.32) - 17_400)).toBeLessThan(200);
  });

  it('decreases monotonically with colour across its range (redder is cooler)', () => {
    let previous = Infinity;
    for (let bv = -0.6; bv <= 2.5; bv += 0.01) {
      const t = ballesterosTemperatureK(bv);
      expect(t).toBeLessThan(previous);
      previous = t;
    }
  });

  it('refuses colours at and below the singularity at −0.674 with a typed error naming the limit', () => {
    try {
      ballesterosTemperatureK(-0.7);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(PhysicsError);
      expect((e as PhysicsError).code).toBe('out_of_range');
      expect((e as PhysicsError).limit).toContain('0.674');
    }
    expect(() => ballesterosTemperatureK(Number.NaN)).toThrow(PhysicsError);
  });

  it('dereddens with E(B−V) before applying the relation (REFERENCES.md "Dereddening")', () => {
    const reddened = colourTemperature({ value: 0.75, sigma: 0 }, { value: 0.1, sigma: 0 });
    expect(reddened.intrinsicColourMag).toBeCloseTo(0.65, 12);
    expect(reddened.temperatureK.value).toBeCloseTo(ballesterosTemperatureK(0.65), 9);
  });

  it('warns outside −0.4 < (B−V)₀ < 2.0 (common practice) and names the limit', () => {
    const hot = colourTemperature({ value: -0.45, sigma: 0.01 }, undefined);
    expect(hot.warnings).toHaveLength(1);
    expect(hot.warnings[0].code).toBe('outside_calibration');
    expect(hot.warnings[0].limit).toContain('2');
    expect(colourTemperature({ value: 0.65, sigma: 0.01 }, undefined).warnings).toHaveLength(0);
  });

  it('Monte Carlo σ agrees with first-order σ where the relation is near linear over ±σ (JCGM 101:2008 vs GUM)', () => {
    const colour = { value: 0.65, sigma: 0.005 };
    const mc = colourTemperature(colour, undefined, { samples: 20_000, seed: 9 });
    const linear = firstOrder((x) => ballesterosTemperatureK(x[0]), [colour], 'temperature_colour');
    expect(mc.temperatureK.sigma / linear.sigma).toBeGreaterThan(0.97);
    expect(mc.temperatureK.sigma / linear.sigma).toBeLessThan(1.03);
  });

  it('Monte Carlo shows the asymmetry near the hot end, where first order cannot', () => {
    const mc = colourTemperature({ value: -0.3, sigma: 0.1 }, undefined, { samples: 4000, seed: 2 });
    const up = mc.temperatureK.high - mc.temperatureK.value;
    const down = mc.temperatureK.value - mc.temperatureK.low;
    // The relation itself, one σ either side: T(−0.4) − T(−0.3) ≈ 5100 K against T(−0.3) − T(−0.2) ≈ 3000 K (Ballesteros 2012), a ratio of 1.7.
    expect(up).toBeGreaterThan(1.3 * down);
  });

  it('is reproducible: the same seed gives the same σ to the last digit', () => {
    const a = colourTemperature({ value: 0.4, sigma: 0.03 }, { value: 0.02, sigma: 0.01 }, { seed: 5 });
    const b = colourTemperature({ value: 0.4, sigma: 0.03 }, { value: 0.02, sigma: 0.01 }, { seed: 5 });
    expect(a.temperatureK.sigma).toBe(b.temperatureK.sigma);
  });
});
