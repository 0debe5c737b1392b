import { fluxFromApparentBolometricMagnitudeWm2, SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG } from './bolometric';
import { CONSTANTS } from './constants';
import { requireFinite, requirePositive, type PhysicsWarning } from './errors';
import { DEFAULT_R_V } from './extinction';
import type { Measured } from './measured';
import { monteCarlo, type DrawModel, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';

/**
 * Bolometric correction in V from effective temperature: Flower (1996, ApJ
 * 469, 355) polynomials in x = log10 T_eff with the coefficients as corrected
 * by Torres (2010, AJ 140, 1158, Table 1).
 *
 * Boundaries: the lower bound of each range is inclusive, as Torres's
 * headings read (log T < 3.70; 3.70 ≤ log T < 3.90; log T ≥ 3.90), so
 * log T = 3.70 exactly belongs to the middle branch and 3.90 to the hot one.
 * The branches do not meet: at 3.70 the middle branch is 0.022 mag below the
 * cool one, at 3.90 the hot branch 0.003 mag above the middle one; both are
 * far below the calibration's scatter and are left as published.
 */

export type BolometricCorrectionBranch = 'cool' | 'middle' | 'hot';

/** Coefficients a, b, c, … of BC_V = a + b x + c x² + … per branch. */
export const TORRES_2010_COEFFICIENTS: Readonly<Record<BolometricCorrectionBranch, readonly number[]>> = Object.freeze({
  cool: Object.freeze([-0.190537291496456e5, 0.155144866764412e5, -0.421278819301717e4, 0.381476328422343e3]),
  middle: Object.freeze([
    -0.370510203809015e5, 0.385672629965804e5, -0.150651486316025e5, 0.261724637119416e4, -0.170623810323864e3,
  ]),
  hot: Object.freeze([
    -0.118115450538963e6, 0.137145973583929e6, -0.636233812100225e5, 0.147412923562646e5, -0.170587278406872e4,
    0.78873172180499e2,
  ]),
});

/** The temperatures of Flower's calibration stars, K; outside them the polynomials extrapolate. */
export const FLOWER_CALIBRATION_RANGE_K = Object.freeze({ min: 2900, max: 52_500 });

/**
 * M_bol☉ with which Torres (2010) pairs these corrections. The IAU 2015 B2
 * scale gives the Sun 4.74 (4.7400 from the nominal L☉ and L₀).
 * @see Torres (2010), AJ 140, 1158
 */
export const TORRES_SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG = 4.73;

/**
 * Shift, in mag, that puts Torres's BC_V on the IAU 2015 bolometric scale:
 * L/L☉ = 10^(−0.4 (M_V + BC_V − 4.73)) on Torres's scale equals
 * L₀ 10^(−0.4 M_bol) on the IAU scale when M_bol = M_V + BC_V + (4.74 − 4.73).
 * Starledger adds it (≈ +0.010 mag, a 0.9 % change in flux) when it turns V
 * into a bolometric flux; bolometricCorrectionVMag itself returns the
 * published values unchanged.
 * @see IAU 2015 Resolution B2; Torres (2010), AJ 140, 1158
 */
export const BC_SHIFT_TO_IAU_2015_MAG = SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG - TORRES_SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG;

/**
 * Branch that owns a temperature in K (lower bounds inclusive; see above).
 * @see Torres (2010), AJ 140, 1158, Table 1
 */
export function bolometricCorrectionBranch(temperatureK: number): BolometricCorrectionBranch {
  requirePositive(temperatureK, 'temperature');
  return branchOfLogT(Math.log10(temperatureK));
}

function branchOfLogT(x: number): BolometricCorrectionBranch {
  if (x < 3.7) return 'cool';
  if (x < 3.9) return 'middle';
  return 'hot';
}

/**
 * BC_V in mag for an effective temperature in K, as published (Torres's
 * M_bol☉ = 4.73 scale). Outside 2900–52 500 K the polynomial is an
 * extrapolation: see bolometricCorrectionWarnings.
 * @see Flower (1996), ApJ 469, 355; Torres (2010), AJ 140, 1158, Table 1
 */
export function bolometricCorrectionVMag(temperatureK: number): number {
  requirePositive(temperatureK, 'temperature');
  return bolometricCorrectionOfLogT(Math.log10(temperatureK));
}

/** BC_V in mag at x = log10 T_eff, by Horner's rule on the branch's polynomial. */
function bolometricCorrectionOfLogT(x: number): number {
  const coefficients = TORRES_2010_COEFFICIENTS[branchOfLogT(x)];
  let sum = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) sum = sum * x + coefficients[i];
  return sum;
}

/**
 * Warning when a temperature in K lies outside Flower's calibration stars (2900–52 500 K).
 * @see Flower (1996), ApJ 469, 355
 */
export function bolometricCorrectionWarnings(temperatureK: number, quantity = 'bolometric_flux'): PhysicsWarning[] {
  const { min, max } = FLOWER_CALIBRATION_RANGE_K;
  if (temperatureK >= min && temperatureK <= max) return [];
  return [
    {
      code: 'outside_calibration',
      quantity,
      message: `T = ${Math.round(temperatureK)} K lies outside ${min}–${max} K, the temperatures of the stars that calibrate the bolometric correction; BC_V is extrapolated`,
      limit: `${min}–${max} K`,
    },
  ];
}

/**
 * Bolometric flux in W m⁻² from V in mag, effective temperature in K and
 * E(B−V) in mag: m_bol = V − R_V E(B−V) + BC_V(T) + BC_SHIFT_TO_IAU_2015_MAG,
 * F = f₀ 10^(−0.4 m_bol).
 * @see IAU 2015 Resolution B2; Flower (1996); Torres (2010); Cardelli et al. (1989) for R_V
 */
export function bolometricFluxFromVWm2(magnitudeVMag: number, temperatureK: number, colourExcessMag = 0, rV = DEFAULT_R_V): number {
  requireFinite(magnitudeVMag, 'magnitude');
  requireFinite(colourExcessMag, 'extinction');
  requirePositive(rV, 'R_V');
  const mBol = magnitudeVMag - rV * colourExcessMag + bolometricCorrectionVMag(temperatureK) + BC_SHIFT_TO_IAU_2015_MAG;
  return fluxFromApparentBolometricMagnitudeWm2(mBol);
}

const F0_WM2 = CONSTANTS.f_0.value;
/** Below this −0.4 m_bol, f₀ 10^(−0.4 m_bol) is surely finite (f₀ ≈ 10^-7.6 W m⁻², the largest double 10^308.25). */
const SAFE_FLUX_EXPONENT = 300;

/** Bolometric flux from V with its Monte Carlo uncertainty and warnings. */
export interface FluxFromV {
  readonly fluxWm2: MonteCarloResult;
  readonly warnings: PhysicsWarning[];
}

/**
 * Bolometric flux in W m⁻² from V (mag), T (K) and optionally E(B−V) (mag),
 * each with σ; σ_F from a seeded Monte Carlo because BC_V(T) is a
 * fourth-to-fifth-degree polynomial in log T. Inputs are treated as
 * independent.
 * @see IAU 2015 Resolution B2; Flower (1996); Torres (2010); JCGM 101:2008
 */
export function bolometricFluxFromV(
  magnitudeVMag: Measured,
  temperatureK: Measured,
  colourExcessMag: Measured | undefined,
  rV = DEFAULT_R_V,
  options: MonteCarloOptions = {},
): FluxFromV {
  const excess = colourExcessMag ?? { value: 0, sigma: 0 };
  // F = f₀ 10^(−0.4 m_bol) falls as m_bol grows, so the draws are ranked by
  // −0.4 m_bol and the power of ten is taken for the few draws the interval
  // is read from; rV is checked once, at the nominal inputs.
  const exponent = (v: number, temperature: number, reddening: number): number => {
    if (!(temperature > 0)) return Number.NaN;
    const mBol = v - rV * reddening + bolometricCorrectionOfLogT(Math.log10(temperature)) + BC_SHIFT_TO_IAU_2015_MAG;
    return Number.isFinite(mBol) ? -0.4 * mBol : Number.NaN;
  };
  const draws: DrawModel = {
    rank: (draws) => {
      for (let s = 0; s < draws.count; s++) {
        const e = exponent(draws.input(0, s), draws.input(1, s), draws.input(2, s));
        draws.keep(s, e > SAFE_FLUX_EXPONENT && !Number.isFinite(F0_WM2 * Math.pow(10, e)) ? Number.NaN : e);
      }
    },
    // The power of ten is within an ulp, not proven monotone between neighbouring doubles: ranks that close are settled by the values.
    rankError: 1e-13,
    value: (x) => F0_WM2 * Math.pow(10, exponent(x[0], x[1], x[2])),
  };
  const fluxWm2 = monteCarlo(
    (x) => bolometricFluxFromVWm2(x[0], x[1], x[2], rV),
    [magnitudeVMag, temperatureK, excess],
    'bolometric_flux',
    options,
    draws,
  );
  return { fluxWm2, warnings: bolometricCorrectionWarnings(temperatureK.value) };
}
