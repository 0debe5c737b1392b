import { CONSTANTS } from './constants';
import { requirePositive, type PhysicsWarning } from './errors';
import type { Measured } from './measured';
import { UNITS } from './units';

/**
 * Above this σp / p, 1/p is a biased estimator of distance and Starledger
 * warns (common practice; the bias grows from σp/p ≈ 0.1–0.2).
 * @see REFERENCES.md "Trigonometric parallax"
 */
export const PARALLAX_RELATIVE_ERROR_LIMIT = 0.2;

/**
 * Distance in m from a trigonometric parallax in rad: d = 1 au / p, which is
 * d [pc] = 1 / p [arcsec] because 1 pc = 1 au / (1 arcsec in rad).
 * @see IAU 2012 Resolution B2 (au); IAU 2015 Resolution B2 (pc = 648 000/π au)
 */
export function parallaxDistanceM(parallaxRad: number): number {
  requirePositive(parallaxRad, 'parallax');
  return CONSTANTS.au.value / parallaxRad;
}

/**
 * Distance in pc from a parallax in mas: d = 1000 / p.
 * @see IAU 2015 Resolution B2
 */
export function parallaxDistancePc(parallaxMas: number): number {
  requirePositive(parallaxMas, 'parallax');
  return 1000 / parallaxMas;
}

/** A parallax distance with its warnings. */
export interface ParallaxDistance {
  /** Distance in m. */
  readonly distanceM: Measured;
  readonly warnings: PhysicsWarning[];
}

/**
 * Distance in m from a parallax in rad, with first-order σ_d / d = σ_p / p
 * and a warning when σ_p / p > 0.2.
 * @see IAU 2015 Resolution B2; REFERENCES.md "Trigonometric parallax" (the 0.2 limit is common practice)
 */
export function parallaxDistance(parallaxRad: Measured): ParallaxDistance {
  const distance = parallaxDistanceM(parallaxRad.value);
  const relative = parallaxRad.sigma / parallaxRad.value;
  const warnings: PhysicsWarning[] = [];
  if (relative > PARALLAX_RELATIVE_ERROR_LIMIT) {
    const mas = parallaxRad.value / UNITS.mas.toSi;
    const sigmaMas = parallaxRad.sigma / UNITS.mas.toSi;
    warnings.push({
      code: 'parallax_low_snr',
      quantity: 'distance_parallax',
      message: `parallax ${mas.toPrecision(3)} ± ${sigmaMas.toPrecision(2)} mas has σp/p = ${relative.toFixed(2)}, above ${PARALLAX_RELATIVE_ERROR_LIMIT}: 1/p is a biased distance and its σ is not Gaussian`,
      limit: `σp/p ≤ ${PARALLAX_RELATIVE_ERROR_LIMIT}`,
    });
  }
  return { distanceM: { value: distance, sigma: distance * relative }, warnings };
}
