import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { airRefractiveIndex, airToVacuumM, vacuumToAirM } from '@shared/physics/air-vacuum';
import { CONSTANTS } from '@shared/physics/constants';
import { classicalRadialVelocityMs, radialVelocity, redshift, relativisticRadialVelocityMs } from '@shared/physics/doppler';
import { PhysicsError } from '@shared/physics/errors';
import { rotationVelocity, rotationVelocityMs } from '@shared/physics/rotation';
import {
  magneticField,
  magneticFieldT,
  ZEEMAN_COEFFICIENT_PER_ANGSTROM_GAUSS,
  ZEEMAN_COEFFICIENT_ROUNDED_PER_ANGSTROM_GAUSS,
  zeemanSplittingM,
} from '@shared/physics/zeeman';

const C = CONSTANTS.c.value;
const ANGSTROM = 1e-10;

describe('air and vacuum wavelengths (Morton 2000)', () => {
  it('Hβ: 4862.721 Å in vacuum is 4861.363 Å in air, and back (Morton 2000, ApJS 130, 403)', () => {
    expect(vacuumToAirM(4862.721 * ANGSTROM) / ANGSTROM).toBeCloseTo(4861.363, 3);
    expect(airToVacuumM(4861.363 * ANGSTROM) / ANGSTROM).toBeCloseTo(4862.721, 3);
  });

  it('air → vacuum → air round-trips to 1e-12 over the optical and near infrared (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 2000e-10, max: 25_000e-10, noNaN: true }), (air) => {
        expect(Math.abs(vacuumToAirM(airToVacuumM(air)) / air - 1)).toBeLessThan(1e-12);
      }),
    );
  });

  it('refuses wavelengths below 2000 Å, where air wavelengths are not used (common practice)', () => {
    expect(() => airRefractiveIndex(1500 * ANGSTROM)).toThrow(PhysicsError);
    expect(() => airToVacuumM(0)).toThrow(PhysicsError);
  });
});

describe('Doppler shift', () => {
  it('z = 1 gives v = 0.6 c relativistically and c classically (REFERENCES.md formulas)', () => {
    expect(relativisticRadialVelocityMs(2, 1) / C).toBeCloseTo(0.6, 12);
    expect(classicalRadialVelocityMs(2, 1) / C).toBeCloseTo(1, 12);
  });

  it('agrees with v = c z to second order for small shifts: v = c (z − z²/2 + …)', () => {
    const rest = 656.279e-9;
    const obs = rest * (1 + 1e-4);
    const z = redshift(obs, rest);
    expect(relativisticRadialVelocityMs(obs, rest)).toBeCloseTo(C * (z - (z * z) / 2), 0);
  });

  it('positive is receding, negative approaching, and v is monotonic in λ_obs (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 2, noNaN: true }), fc.double({ min: 1.0001, max: 1.1, noNaN: true }), (r, k) => {
        const rest = 500e-9;
        const v1 = relativisticRadialVelocityMs(r * rest, rest);
        const v2 = relativisticRadialVelocityMs(r * k * rest, rest);
        expect(v2).toBeGreaterThan(v1);
        expect(Math.abs(v1)).toBeLessThan(C);
      }),
    );
    expect(relativisticRadialVelocityMs(501e-9, 500e-9)).toBeGreaterThan(0);
    expect(relativisticRadialVelocityMs(499e-9, 500e-9)).toBeLessThan(0);
  });

  it('air wavelengths give the same velocity as the same lines in vacuum (Morton 2000 conversion)', () => {
    const restVac = 6564.614e-10;
    const obsVac = restVac * (1 + 1e-4);
    const vac = radialVelocity({ value: obsVac, sigma: 0 }, { value: restVac, sigma: 0 }, 'vacuum');
    const air = radialVelocity({ value: vacuumToAirM(obsVac), sigma: 0 }, { value: vacuumToAirM(restVac), sigma: 0 }, 'air');
    expect(air.value).toBeCloseTo(vac.value, 3);
  });

  it('propagates σ: 0.005 nm on Hα is about 2.3 km/s (c σ_λ / λ)', () => {
    const v = radialVelocity({ value: 656.3e-9, sigma: 0.005e-9 }, { value: 656.279e-9, sigma: 0 }, 'vacuum');
    expect(v.sigma).toBeCloseTo((C * 0.005) / 656.279, -1);
  });
});

describe('rotation from the two limbs', () => {
  it('v sin i = c Δλ / (2 λ₀): 0.02 nm across Hα is 4.568 km/s (REFERENCES.md, CODATA c)', () => {
    expect(rotationVelocityMs(0.02e-9, 656.279e-9)).toBeCloseTo((C * 0.02) / (2 * 656.279), 6);
    expect(rotationVelocityMs(0.02e-9, 656.279e-9) / 1000).toBeCloseTo(4.568, 3);
  });

  it('propagates σ first order and refuses a negative separation', () => {
    const v = rotationVelocity({ value: 0.02e-9, sigma: 0.002e-9 }, { value: 656.279e-9, sigma: 0 });
    expect(v.sigma / v.value).toBeCloseTo(0.1, 12);
    expect(() => rotationVelocityMs(-0.01e-9, 656e-9)).toThrow(PhysicsError);
  });

  it('refuses a separation of 2 λ₀ or more, which would make v sin i = c Δλ / (2 λ₀) reach c (SI definition of c)', () => {
    expect(() => rotationVelocityMs(2 * 656.279e-9, 656.279e-9)).toThrow(PhysicsError);
    expect(() => rotationVelocityMs(1e291, 656.279e-9)).toThrow(/c/);
    expect(rotationVelocityMs(656.279e-9, 656.279e-9)).toBeCloseTo(C / 2, 3);
  });

  it('a measured separation of 0 ± 0.002 nm is data: v sin i = 0 ± c σ_Δλ / (2 λ₀) = 0 ± 0.4568 km/s (REFERENCES.md, CODATA c)', () => {
    expect(rotationVelocityMs(0, 656.279e-9)).toBe(0);
    const v = rotationVelocity({ value: 0, sigma: 0.002e-9 }, { value: 656.279e-9, sigma: 0.001e-9 });
    expect(v.value).toBe(0);
    // ∂v/∂Δλ = c / (2 λ₀); the rest wavelength's σ adds nothing at Δλ = 0 (∂v/∂λ₀ = −c Δλ / 2λ₀²).
    expect(v.sigma).toBeCloseTo((C * 0.002) / (2 * 656.279), 9);
  });
});

describe('Zeeman splitting', () => {
  it('e / (4π m_e c) = 4.6686e-13 Å⁻¹ G⁻¹ from CODATA 2018 e, m_e, c', () => {
    const k = CONSTANTS.e.value / (4 * Math.PI * CONSTANTS.m_e.value * CONSTANTS.c.value);
    expect(k * 1e-14).toBeCloseTo(4.6686e-13, 16);
    expect(ZEEMAN_COEFFICIENT_PER_ANGSTROM_GAUSS).toBeCloseTo(4.6686e-13, 16);
  });

  it('the rounded 4.67e-13 agrees with the exact coefficient to 0.03 % (REFERENCES.md)', () => {
    expect(Math.abs(ZEEMAN_COEFFICIENT_ROUNDED_PER_ANGSTROM_GAUSS / ZEEMAN_COEFFICIENT_PER_ANGSTROM_GAUSS - 1)).toBeLessThan(3e-4);
  });

  it('g = 3 at 5250 Å in 1 kG splits by 3.86e-2 Å (Δλ = 4.67e-13 g λ² B with λ in Å, B in G)', () => {
    const dl = zeemanSplittingM(3, 5250e-10, 0.1);
    expect(dl / ANGSTROM).toBeCloseTo(4.67e-13 * 3 * 5250 ** 2 * 1000, 4);
  });

  it('field from splitting round-trips, and propagates (σ_B/B)² = (σ_Δλ/Δλ)² + (2σ_λ/λ)²', () => {
    const dl = zeemanSplittingM(1.5, 6173e-10, 0.25);
    expect(magneticFieldT(dl, 1.5, 6173e-10)).toBeCloseTo(0.25, 12);
    const b = magneticField({ value: dl, sigma: 0.1 * dl }, 1.5, { value: 6173e-10, sigma: 0 });
    expect(b.sigma / b.value).toBeCloseTo(0.1, 12);
  });

  it('refuses g = 0 and negative splittings', () => {
    expect(() => magneticFieldT(1e-12, 0, 5e-7)).toThrow(PhysicsError);
    expect(() => magneticFieldT(-1e-12, 1, 5e-7)).toThrow(PhysicsError);
  });

  it('a measured splitting of 0 ± 1 mÅ is data: B = 0 ± σ_Δλ / (k g λ²) (k = 4.6686e-13 Å⁻¹ G⁻¹, CODATA 2018)', () => {
    expect(magneticFieldT(0, 3, 5250.2e-10)).toBe(0);
    const b = magneticField({ value: 0, sigma: 1e-3 * ANGSTROM }, 3, { value: 5250.2e-10, sigma: 0.01e-10 });
    expect(b.value).toBe(0);
    // In gauss: 1e-3 Å / (4.6686e-13 × 3 × 5250.2²) = 25.9 G, i.e. 2.59e-3 T.
    expect(b.sigma * 1e4).toBeCloseTo(1e-3 / (4.6686e-13 * 3 * 5250.2 ** 2), 1);
  });
});
