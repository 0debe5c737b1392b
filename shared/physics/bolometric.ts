import { CONSTANTS } from './constants';
import { requireFinite, requirePositive } from './errors';
import type { Measured } from './measured';

const L0 = CONSTANTS.L_0.value;
const F0 = CONSTANTS.f_0.value;
const TEN_PC_M = 10 * CONSTANTS.pc.value;
/** 2.5 / ln 10: d(mag) per unit relative change of a flux or luminosity. */
const MAG_PER_LN = 2.5 / Math.LN10;

/**
 * Absolute bolometric magnitude from a luminosity in W: M_bol = −2.5 log10(L / L₀).
 * @see IAU 2015 Resolution B2 (L₀ = 3.0128e28 W)
 */
export function absoluteBolometricMagnitudeMag(luminosityW: number): number {
  requirePositive(luminosityW, 'luminosity');
  return -2.5 * Math.log10(luminosityW / L0);
}

/**
 * Luminosity in W from an absolute bolometric magnitude in mag: L = L₀ 10^(−0.4 M_bol).
 * @see IAU 2015 Resolution B2
 */
export function luminosityFromAbsoluteBolometricMagnitudeW(absoluteMagnitudeMag: number): number {
  requireFinite(absoluteMagnitudeMag, 'absolute_bolometric_magnitude');
  return L0 * Math.pow(10, -0.4 * absoluteMagnitudeMag);
}

/**
 * Apparent bolometric magnitude from a bolometric flux in W m⁻²: m_bol = −2.5 log10(F / f₀).
 * @see IAU 2015 Resolution B2 (f₀ = 2.518021002e-8 W m⁻²)
 */
export function apparentBolometricMagnitudeMag(fluxWm2: number): number {
  requirePositive(fluxWm2, 'bolometric_flux');
  return -2.5 * Math.log10(fluxWm2 / F0);
}

/**
 * Bolometric flux in W m⁻² from an apparent bolometric magnitude in mag: F = f₀ 10^(−0.4 m_bol).
 * @see IAU 2015 Resolution B2
 */
export function fluxFromApparentBolometricMagnitudeWm2(apparentMagnitudeMag: number): number {
  requireFinite(apparentMagnitudeMag, 'apparent_bolometric_magnitude');
  return F0 * Math.pow(10, -0.4 * apparentMagnitudeMag);
}

/**
 * Distance modulus m − M = 5 log10(d / 10 pc), in mag, for a distance in m.
 * @see IAU 2015 Resolution B2 (pc = 648 000/π au)
 */
export function distanceModulusMag(distanceM: number): number {
  requirePositive(distanceM, 'distance');
  return 5 * Math.log10(distanceM / TEN_PC_M);
}

/**
 * The Sun's absolute bolometric magnitude on the IAU 2015 scale, from the
 * nominal solar luminosity: −2.5 log10(3.828e26 / 3.0128e28) = 4.7400 mag.
 * @see IAU 2015 Resolutions B2 and B3
 */
export const SOLAR_ABSOLUTE_BOLOMETRIC_MAGNITUDE_MAG = absoluteBolometricMagnitudeMag(CONSTANTS.L_sun.value);

/**
 * M_bol with first-order uncertainty from a luminosity in W:
 * σ_M = (2.5 / ln 10) σ_L / L. Out: mag.
 * @see IAU 2015 Resolution B2
 */
export function absoluteBolometricMagnitude(luminosityW: Measured): Measured {
  const value = absoluteBolometricMagnitudeMag(luminosityW.value);
  return { value, sigma: (MAG_PER_LN * luminosityW.sigma) / luminosityW.value };
}
