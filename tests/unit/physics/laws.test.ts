import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { PhysicsError } from '@shared/physics/errors';
import { distanceFromLuminosity, distanceFromLuminosityM, fluxFromLuminosityWm2, luminosityFromFlux, luminosityFromFluxW } from '@shared/physics/inverse-square';
import { parallaxDistance, parallaxDistanceM, parallaxDistancePc } from '@shared/physics/parallax';
import {
  luminosityFromRadius,
  luminosityFromRadiusW,
  radiusFromLuminosity,
  radiusFromLuminosityM,
  temperatureFromLuminosityK,
} from '@shared/physics/stefan-boltzmann';
import { UNITS } from '@shared/physics/units';

const L_SUN = CONSTANTS.L_sun.value;
const R_SUN = CONSTANTS.R_sun.value;
const AU = CONSTANTS.au.value;
const PC = CONSTANTS.pc.value;

const positive = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

describe('Stefan–Boltzmann law', () => {
  it('R☉ and T☉ nominal give L = 3.8280e26 W to 3e-6 (IAU 2015 Resolution B3, CODATA 2018 σ)', () => {
    const l = luminosityFromRadiusW(R_SUN, CONSTANTS.T_sun.value);
    expect(Math.abs(l / 3.828e26 - 1)).toBeLessThan(3e-6);
  });

  it('propagates (σ_R/R)² = (σ_L/2L)² + (2σ_T/T)² (REFERENCES.md "Uncertainties")', () => {
    const r = radiusFromLuminosity({ value: L_SUN, sigma: 0.1 * L_SUN }, { value: 5772, sigma: 57.72 });
    expect(r.sigma / r.value).toBeCloseTo(Math.hypot(0.05, 0.02), 12);
    const l = luminosityFromRadius({ value: R_SUN, sigma: 0.01 * R_SUN }, { value: 5772, sigma: 57.72 });
    expect(l.sigma / l.value).toBeCloseTo(Math.hypot(0.02, 0.04), 12);
  });

  it('round trip R → L → R and L → T → L (property)', () => {
    fc.assert(
      fc.property(positive(1e-3, 1e4), positive(1500, 200_000), (rRsun, t) => {
        const r = rRsun * R_SUN;
        const l = luminosityFromRadiusW(r, t);
        expect(Math.abs(radiusFromLuminosityM(l, t) / r - 1)).toBeLessThan(1e-12);
        expect(Math.abs(temperatureFromLuminosityK(l, r) / t - 1)).toBeLessThan(1e-12);
      }),
    );
  });

  it('L grows with R and with T; R shrinks with T at fixed L (property)', () => {
    fc.assert(
      fc.property(positive(1e-2, 1e3), positive(2000, 50_000), positive(1.0001, 3), (rRsun, t, k) => {
        const r = rRsun * R_SUN;
        expect(luminosityFromRadiusW(r * k, t)).toBeGreaterThan(luminosityFromRadiusW(r, t));
        expect(luminosityFromRadiusW(r, t * k)).toBeGreaterThan(luminosityFromRadiusW(r, t));
        const l = luminosityFromRadiusW(r, t);
        expect(radiusFromLuminosityM(l, t * k)).toBeLessThan(radiusFromLuminosityM(l, t));
      }),
    );
  });

  it('refuses zero, negative and non-finite inputs', () => {
    expect(() => radiusFromLuminosityM(0, 5000)).toThrow(PhysicsError);
    expect(() => radiusFromLuminosityM(L_SUN, -5000)).toThrow(PhysicsError);
    expect(() => luminosityFromRadiusW(Number.POSITIVE_INFINITY, 5000)).toThrow(PhysicsError);
  });
});

describe('inverse-square law', () => {
  it('L☉ nominal at 1 au gives 1361.2 W m⁻², the nominal solar irradiance (IAU 2015 Resolution B3)', () => {
    const s = fluxFromLuminosityWm2(L_SUN, AU);
    expect(s).toBeCloseTo(1361.2, 1);
    expect(Math.abs(s / CONSTANTS.S_sun.value - 1)).toBeLessThan(2e-4);
  });

  it('round trip L → F → L and L → d → L (property)', () => {
    fc.assert(
      fc.property(positive(1e-5, 1e7), positive(1, 1e5), (lLsun, dPc) => {
        const l = lLsun * L_SUN;
        const d = dPc * PC;
        const f = fluxFromLuminosityWm2(l, d);
        expect(Math.abs(luminosityFromFluxW(f, d) / l - 1)).toBeLessThan(1e-12);
        const back = distanceFromLuminosityM(l, f);
        expect(Math.abs(back / d - 1)).toBeLessThan(1e-12);
        expect(Math.abs(luminosityFromFluxW(f, back) / l - 1)).toBeLessThan(1e-12);
      }),
    );
  });

  it('flux falls as the distance grows (property)', () => {
    fc.assert(
      fc.property(positive(1e-3, 1e6), positive(1, 1e5), positive(1.0001, 10), (lLsun, dPc, k) => {
        expect(fluxFromLuminosityWm2(lLsun * L_SUN, dPc * k * PC)).toBeLessThan(fluxFromLuminosityWm2(lLsun * L_SUN, dPc * PC));
      }),
    );
  });

  it('propagates (σ_L/L)² = (σ_F/F)² + (2σ_d/d)² and (σ_d/d)² = (σ_L/2L)² + (σ_F/2F)² (REFERENCES.md)', () => {
    const l = luminosityFromFlux({ value: 1e-10, sigma: 3e-12 }, { value: 10 * PC, sigma: 0.4 * PC });
    expect(l.sigma / l.value).toBeCloseTo(Math.hypot(0.03, 0.08), 12);
    const d = distanceFromLuminosity({ value: L_SUN, sigma: 0.2 * L_SUN }, { value: 1e-10, sigma: 1e-11 });
    expect(d.sigma / d.value).toBeCloseTo(Math.hypot(0.1, 0.05), 12);
  });
});

describe('trigonometric parallax', () => {
  it('1 arcsec gives 1 pc, 1 mas gives 1000 pc (definition of the parsec, IAU 2015 B2)', () => {
    expect(parallaxDistanceM(UNITS.arcsec.toSi) / PC).toBeCloseTo(1, 12);
    expect(parallaxDistancePc(1)).toBe(1000);
    expect(parallaxDistanceM(UNITS.mas.toSi) / PC).toBeCloseTo(1000, 9);
  });

  it('warns when σp/p > 0.2 (common practice) and names the limit', () => {
    const good = parallaxDistance({ value: 10 * UNITS.mas.toSi, sigma: 1 * UNITS.mas.toSi });
    expect(good.warnings).toHaveLength(0);
    expect(good.distanceM.sigma / good.distanceM.value).toBeCloseTo(0.1, 12);
    const poor = parallaxDistance({ value: 10 * UNITS.mas.toSi, sigma: 2.5 * UNITS.mas.toSi });
    expect(poor.warnings[0].code).toBe('parallax_low_snr');
    expect(poor.warnings[0].quantity).toBe('distance_parallax');
    expect(poor.warnings[0].limit).toContain('0.2');
  });

  it('refuses a zero or negative parallax with a typed error', () => {
    for (const p of [0, -1e-9, Number.NaN]) {
      try {
        parallaxDistanceM(p);
        expect.unreachable();
      } catch (e) {
        expect((e as PhysicsError).quantity).toBe('parallax');
      }
    }
  });
});
