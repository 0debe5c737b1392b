import { describe, expect, it } from 'vitest';
import {
  absoluteBolometricMagnitude,
  absoluteBolometricMagnitudeMag,
  apparentBolometricMagnitudeMag,
  distanceModulusMag,
  fluxFromApparentBolometricMagnitudeWm2,
  luminosityFromAbsoluteBolometricMagnitudeW,
  SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG,
} from '@shared/physics/bolometric';
import {
  BC_SHIFT_TO_IAU_2015_MAG,
  bolometricCorrectionBranch,
  bolometricCorrectionVMag,
  bolometricFluxFromV,
  bolometricFluxFromVWm2,
} from '@shared/physics/bolometric-correction';
import { CONSTANTS } from '@shared/physics/constants';
import { PhysicsError } from '@shared/physics/errors';
import { DWARF_SEQUENCE } from '@shared/physics/tables/dwarf-sequence';

describe('bolometric magnitudes (IAU 2015 Resolution B2)', () => {
  it('M_bol☉ = 4.74 for the nominal solar luminosity (B2, with B3 L☉)', () => {
    expect(absoluteBolometricMagnitudeMag(CONSTANTS.L_sun.value)).toBeCloseTo(4.74, 3);
    expect(SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG).toBeCloseTo(4.74, 3);
  });

  it('m_bol of the nominal irradiance 1361 W m⁻² is −26.832 (B2)', () => {
    expect(apparentBolometricMagnitudeMag(1361)).toBeCloseTo(-26.832, 3);
  });

  it('M_bol = 0 at L₀ and m_bol = 0 at f₀ (B2 definitions), and the inverses round-trip', () => {
    expect(absoluteBolometricMagnitudeMag(3.0128e28)).toBeCloseTo(0, 12);
    expect(apparentBolometricMagnitudeMag(2.518_021_002e-8)).toBeCloseTo(0, 12);
    expect(luminosityFromAbsoluteBolometricMagnitudeW(4.74) / CONSTANTS.L_sun.value).toBeCloseTo(1, 3);
    expect(fluxFromApparentBolometricMagnitudeWm2(-26.832) / 1361).toBeCloseTo(1, 3);
  });

  it('f₀ is L₀ seen from 10 pc: m − M = 5 log10(d / 10 pc) is 0 at 10 pc (B2)', () => {
    const tenPc = 10 * CONSTANTS.pc.value;
    expect(CONSTANTS.L_0.value / (4 * Math.PI * tenPc ** 2) / CONSTANTS.f_0.value).toBeCloseTo(1, 9);
    expect(distanceModulusMag(tenPc)).toBeCloseTo(0, 12);
    expect(distanceModulusMag(100 * CONSTANTS.pc.value)).toBeCloseTo(5, 12);
  });

  it('σ_M = 1.0857 σ_L / L (first order of −2.5 log10)', () => {
    const m = absoluteBolometricMagnitude({ value: 3.828e26, sigma: 0.01 * 3.828e26 });
    expect(m.sigma).toBeCloseTo(0.010857, 5);
  });

  it('refuses a non-positive luminosity or flux', () => {
    expect(() => absoluteBolometricMagnitudeMag(0)).toThrow(PhysicsError);
    expect(() => apparentBolometricMagnitudeMag(-1)).toThrow(PhysicsError);
  });
});

describe('bolometric correction (Flower 1996, Torres 2010 coefficients)', () => {
  it('BC_V at 5772 K ≈ −0.08 (Torres 2010, solar value of the calibration)', () => {
    expect(bolometricCorrectionVMag(5772)).toBeCloseTo(-0.08, 2);
  });

  it('a 3500 K star uses the cool branch (Torres 2010 Table 1: log T < 3.70), evaluated from the published coefficients', () => {
    expect(bolometricCorrectionBranch(3500)).toBe('cool');
    const x = Math.log10(3500);
    const cool = -0.190537291496456e5 + 0.155144866764412e5 * x - 0.421278819301717e4 * x ** 2 + 0.381476328422343e3 * x ** 3;
    expect(bolometricCorrectionVMag(3500)).toBeCloseTo(cool, 9);
    const middle =
      -0.370510203809015e5 + 0.385672629965804e5 * x - 0.150651486316025e5 * x ** 2 + 0.261724637119416e4 * x ** 3 - 0.170623810323864e3 * x ** 4;
    expect(Math.abs(bolometricCorrectionVMag(3500) - middle)).toBeGreaterThan(0.01);
  });

  it('owns each boundary with the branch above it, and the published jumps are 0.022 and 0.003 mag (REFERENCES.md pitfalls)', () => {
    expect(bolometricCorrectionBranch(10 ** 3.7)).toBe('middle');
    expect(bolometricCorrectionBranch(10 ** 3.7 - 1e-6)).toBe('cool');
    expect(bolometricCorrectionBranch(10 ** 3.9)).toBe('hot');
    expect(bolometricCorrectionBranch(10 ** 3.9 - 1e-6)).toBe('middle');
    const jumpAt370 = bolometricCorrectionVMag(10 ** 3.7 - 1e-6) - bolometricCorrectionVMag(10 ** 3.7);
    const jumpAt390 = bolometricCorrectionVMag(10 ** 3.9 - 1e-6) - bolometricCorrectionVMag(10 ** 3.9);
    expect(jumpAt370).toBeCloseTo(0.022, 3);
    expect(jumpAt390).toBeCloseTo(-0.003, 3);
  });

  it('agrees within 0.1 mag with the BC_V column of the mean dwarf sequence from 4400 K to 31 400 K — a comparison of two independent calibrations (Pecaut & Mamajek 2013 vs Flower/Torres)', () => {
    const rows = DWARF_SEQUENCE.filter((row) => row.teffK >= 4400 && row.teffK <= 31_400);
    expect(rows.length).toBeGreaterThan(50);
    for (const row of rows) {
      expect(Math.abs(bolometricCorrectionVMag(row.teffK) - row.bcVMag), row.spectralType).toBeLessThan(0.1);
    }
  });

  it('refuses temperatures outside Flower’s calibration stars, 2900–52 500 K (REFERENCES.md), naming the range, instead of extrapolating', () => {
    // Extrapolated, the polynomials give BC_V(200 000 K) ≈ +45 mag and BC_V(1500 K) ≈ −53 mag, where real
    // corrections are a few magnitudes (the dwarf table's BC_V spans −4.3 to −4.6 … +0.0: Pecaut & Mamajek 2013).
    for (const t of [1500, 2899, 52_501, 200_000]) {
      const refusal = (() => {
        try {
          bolometricCorrectionVMag(t);
        } catch (error) {
          return error;
        }
        return null;
      })();
      expect(refusal, `${t} K`).toBeInstanceOf(PhysicsError);
      expect(refusal).toMatchObject({ code: 'out_of_range', limit: '2900–52500 K' });
      expect(() => bolometricFluxFromVWm2(8, t, 0)).toThrow(PhysicsError);
      expect(() => bolometricFluxFromV({ value: 8, sigma: 0.01 }, { value: t, sigma: 10 }, undefined)).toThrow(PhysicsError);
    }
    // The ends of the range themselves are calibrated (the coolest and hottest calibration stars).
    expect(Number.isFinite(bolometricCorrectionVMag(2900))).toBe(true);
    expect(Number.isFinite(bolometricCorrectionVMag(52_500))).toBe(true);
  });

  it('leaves out the Monte Carlo draws of T that fall outside the calibration: their share is the normal tail outside 2900–52 500 K', () => {
    // T = 50 000 ± 20 000 K. Before, every draw up to 200 000 K was kept with an extrapolated BC_V (+45 mag there).
    const flux = bolometricFluxFromV({ value: 8, sigma: 0.01 }, { value: 50_000, sigma: 20_000 }, undefined, 3.1, { samples: 4000, seed: 5 });
    // Φ by Abramowitz & Stegun (1964) 7.1.26 (|error| < 1.5e-7), written here independently of the engine.
    const phi = (z: number): number => {
      const x = Math.abs(z) / Math.SQRT2;
      const t = 1 / (1 + 0.3275911 * x);
      const erf = 1 - t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429)))) * Math.exp(-x * x);
      return z >= 0 ? (1 + erf) / 2 : (1 - erf) / 2;
    };
    const expected = phi((2900 - 50_000) / 20_000) + 1 - phi((52_500 - 50_000) / 20_000);
    const share = flux.fluxWm2.rejected / (flux.fluxWm2.rejected + flux.fluxWm2.accepted);
    // Binomial σ of the share at 4000 draws is √(0.46 × 0.54 / 4000) ≈ 0.008: allow 4 of them.
    expect(Math.abs(share - expected)).toBeLessThan(0.032);
  });

  it('refuses a flux that underflows to zero or overflows (a star of V = 800 mag has no flux a double can hold)', () => {
    // f₀ 10^(−0.4 × 820) = 2.5e-8 × 1e-328 lies below the smallest double (≈ 4.9e-324, IEEE 754) and rounds to 0;
    // f₀ 10^(+320) overflows to Infinity.
    expect(() => bolometricFluxFromVWm2(820, 5772, 0)).toThrow(PhysicsError);
    expect(() => bolometricFluxFromVWm2(-800, 5772, 0)).toThrow(PhysicsError);
    try {
      bolometricFluxFromVWm2(820, 5772, 0);
    } catch (error) {
      expect(error).toMatchObject({ code: 'out_of_range', quantity: 'bolometric_flux' });
    }
  });

  it('puts Torres’s scale (M_bol☉ = 4.73) on the IAU 2015 one (4.74) by +0.010 mag', () => {
    expect(BC_SHIFT_TO_IAU_2015_MAG).toBeCloseTo(0.01, 3);
  });

  it('a solar twin at 10 pc with M_V☉ = 4.81 (M_bol☉ 4.73 minus BC☉ −0.08 on Torres 2010’s scale; from memory) gets the IAU 2015 flux of L☉ at 10 pc to 0.2 %', () => {
    const flux = bolometricFluxFromVWm2(4.81, 5772, 0);
    const expected = CONSTANTS.L_sun.value / (4 * Math.PI * (10 * CONSTANTS.pc.value) ** 2);
    expect(Math.abs(flux / expected - 1)).toBeLessThan(0.002);
  });

  it('extinction A_V = 3.1 E(B−V) brightens the dereddened flux by 10^(0.4 A_V) (Cardelli et al. 1989 R_V)', () => {
    const clear = bolometricFluxFromVWm2(8, 6000, 0);
    const reddened = bolometricFluxFromVWm2(8, 6000, 0.1);
    expect(reddened / clear).toBeCloseTo(10 ** (0.4 * 0.31), 10);
  });

  it('Monte Carlo σ of the flux from V is close to first order for small σ (first order: σ_F / F = 0.4 ln 10 σ_V)', () => {
    const flux = bolometricFluxFromV({ value: 8, sigma: 0.01 }, { value: 5772, sigma: 0 }, undefined, 3.1, { samples: 20_000, seed: 3 });
    expect(flux.fluxWm2.sigma / flux.fluxWm2.value).toBeCloseTo((0.01 * Math.LN10) / 2.5, 3);
  });
});
