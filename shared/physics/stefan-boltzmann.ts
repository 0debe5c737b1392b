import { CONSTANTS } from './constants';
import { requirePositive } from './errors';
import { powerLaw, type Measured } from './measured';

const SIGMA = CONSTANTS.sigma.value;
const FOUR_PI_SIGMA = 4 * Math.PI * SIGMA;

/**
 * Luminosity in W of a sphere of radius in m and effective temperature in K: L = 4π R² σ T⁴.
 * @see CODATA 2018 σ; check: R☉, T☉ nominal → 3.8280e26 W (IAU 2015 B3)
 */
export function luminosityFromRadiusW(radiusM: number, temperatureK: number): number {
  requirePositive(radiusM, 'radius');
  requirePositive(temperatureK, 'temperature');
  const t2 = temperatureK * temperatureK;
  return FOUR_PI_SIGMA * radiusM * radiusM * t2 * t2;
}

/**
 * Radius in m from a luminosity in W and an effective temperature in K: R = √(L / 4π σ T⁴).
 * @see CODATA 2018 σ
 */
export function radiusFromLuminosityM(luminosityW: number, temperatureK: number): number {
  requirePositive(luminosityW, 'luminosity');
  requirePositive(temperatureK, 'temperature');
  // T⁴ as (T²)², two products: Math.pow costs several times more, and the Monte Carlo asks it a thousand times per star.
  const t2 = temperatureK * temperatureK;
  return Math.sqrt(luminosityW / (FOUR_PI_SIGMA * t2 * t2));
}

/**
 * Effective temperature in K from a luminosity in W and a radius in m: T = (L / 4π σ R²)^¼.
 * @see CODATA 2018 σ
 */
export function temperatureFromLuminosityK(luminosityW: number, radiusM: number): number {
  requirePositive(luminosityW, 'luminosity');
  requirePositive(radiusM, 'radius');
  return Math.pow(luminosityW / (FOUR_PI_SIGMA * radiusM * radiusM), 0.25);
}

/**
 * L = 4π R² σ T⁴ with first-order σ: (σ_L/L)² = (2σ_R/R)² + (4σ_T/T)². In: m, K; out: W.
 * @see CODATA 2018 σ; REFERENCES.md "Uncertainties"
 */
export function luminosityFromRadius(radiusM: Measured, temperatureK: Measured): Measured {
  return powerLaw(
    FOUR_PI_SIGMA,
    [
      { x: radiusM, power: 2, name: 'radius' },
      { x: temperatureK, power: 4, name: 'temperature' },
    ],
    'luminosity',
  );
}

/**
 * R = √(L / 4π σ T⁴) with first-order σ: (σ_R/R)² = (σ_L/2L)² + (2σ_T/T)². In: W, K; out: m.
 * @see CODATA 2018 σ; REFERENCES.md "Uncertainties"
 */
export function radiusFromLuminosity(luminosityW: Measured, temperatureK: Measured): Measured {
  return powerLaw(
    1 / Math.sqrt(FOUR_PI_SIGMA),
    [
      { x: luminosityW, power: 0.5, name: 'luminosity' },
      { x: temperatureK, power: -2, name: 'temperature' },
    ],
    'radius',
  );
}
