import { fluxFromApparentBolometricMagnitudeWm2, SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG } from './bolometric';
import { PhysicsError, requireFinite, requirePositive } from './errors';
import { DEFAULT_R_V } from './extinction';
import type { Measured } from './measured';
import { monteCarlo, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';

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

/**
 * The temperatures of Flower's calibration stars, K. Torres's Table 1 gives
 * the coefficients without a range; the range is the one REFERENCES.md
 * states for Flower (1996), not re-read from the paper here. Outside it the
 * polynomials run away (extrapolated, BC_V(200 000 K) = +45 mag and
 * BC_V(1500 K) = −53 mag, where real corrections are a few magnitudes), so
 * Starledger refuses them rather than warn.
 * @see Flower (1996), ApJ 469, 355; REFERENCES.md "Bolometric correction"
 */
export const FLOWER_CALIBRATION_RANGE_K = Object.freeze({ min: 2900, max: 52_500 });

/** The calibration range in words, as refusals name it. */
const CALIBRATION_LIMIT = `${FLOWER_CALIBRATION_RANGE_K.min}–${FLOWER_CALIBRATION_RANGE_K.max} K`;

function insideCalibration(temperatureK: number): boolean {
  return temperatureK >= FLOWER_CALIBRATION_RANGE_K.min && temperatureK <= FLOWER_CALIBRATION_RANGE_K.max;
}

/**
 * Throws PhysicsError('out_of_range') naming 2900–52 500 K unless the
 * temperature in K lies inside Flower's calibration.
 * @see FLOWER_CALIBRATION_RANGE_K
 */
export function requireInsideBolometricCalibration(temperatureK: number, quantity = 'bolometric_flux'): number {
  requirePositive(temperatureK, 'temperature');
  if (!insideCalibration(temperatureK)) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `T = ${Math.round(temperatureK)} K lies outside ${CALIBRATION_LIMIT}, the temperatures of the stars that calibrate the bolometric correction (Flower 1996); BC_V is not extrapolated, so no flux follows from V`,
      CALIBRATION_LIMIT,
    );
  }
  return temperatureK;
}

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
 * M_bol☉ = 4.73 scale). Outside 2900–52 500 K, PhysicsError('out_of_range')
 * naming the range: the polynomial is not extrapolated.
 * @see Flower (1996), ApJ 469, 355; Torres (2010), AJ 140, 1158, Table 1
 */
export function bolometricCorrectionVMag(temperatureK: number, quantity = 'bolometric_flux'): number {
  requireInsideBolometricCalibration(temperatureK, quantity);
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
  const flux = fluxFromApparentBolometricMagnitudeWm2(mBol);
  // A double holds f₀ 10^(−0.4 m_bol) only for m_bol between about −770 and +790 (IEEE 754 range): beyond, 0 or Infinity is no flux.
  if (!(flux > 0) || !Number.isFinite(flux)) {
    throw new PhysicsError(
      'out_of_range',
      'bolometric_flux',
      `m_bol = ${mBol.toPrecision(4)} mag gives a flux of ${flux} W m⁻², which is no star's: the flux underflows or overflows`,
      'flux > 0 and finite',
    );
  }
  return flux;
}

/** Bolometric flux from V with its Monte Carlo uncertainty and warnings. */
export interface FluxFromV {
  readonly fluxWm2: MonteCarloResult;
}

/**
 * Bolometric flux in W m⁻² from V (mag), T (K) and optionally E(B−V) (mag),
 * each with σ; σ_F from a seeded Monte Carlo because BC_V(T) is a
 * fourth-to-fifth-degree polynomial in log T. Inputs are treated as
 * independent. A nominal T outside 2900–52 500 K is refused (PhysicsError
 * 'out_of_range' naming the range); draws outside it are left out.
 * @see IAU 2015 Resolution B2; Flower (1996); Torres (2010); JCGM 101:2008
 */
export function bolometricFluxFromV(
  magnitudeVMag: Measured,
  temperatureK: Measured,
  colourExcessMag: Measured | undefined,
  rV = DEFAULT_R_V,
  options: MonteCarloOptions = {},
): FluxFromV {
  requireInsideBolometricCalibration(temperatureK.value);
  const excess = colourExcessMag ?? { value: 0, sigma: 0 };
  // Draws of T outside the calibration are left out (counted as rejected), as the law refuses them.
  const fluxWm2 = monteCarlo(
    (x) => bolometricFluxFromVWm2(x[0], x[1], x[2], rV),
    [magnitudeVMag, temperatureK, excess],
    'bolometric_flux',
    options,
  );
  return { fluxWm2 };
}
