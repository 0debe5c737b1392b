import { CONSTANTS } from './constants';
import { PhysicsError, requireFinite, requireFiniteResult, requireNonNegative, requirePositive, requireUncertainty } from './errors';
import type { Measured } from './measured';

/**
 * Normal Zeeman effect: each σ component lies Δλ = g e λ² B / (4π m_e c) from
 * the line centre. Starledger's `zeeman_separation` is that displacement of
 * one σ component from the centre (half the σ⁺–σ⁻ distance).
 */

/**
 * The rounded coefficient of Δλ = 4.67 × 10⁻¹³ g λ² B, with λ and Δλ in Å and
 * B in gauss, as usually quoted.
 * @see REFERENCES.md "Zeeman splitting"
 */
export const ZEEMAN_COEFFICIENT_ROUNDED_PER_ANGSTROM_GAUSS = 4.67e-13;

/**
 * e / (4π m_e c) in m⁻¹ T⁻¹ (≈ 46.686) from CODATA 2018; Starledger computes with this one.
 * @see CODATA 2018 e, m_e, c
 */
export const ZEEMAN_COEFFICIENT_PER_M_TESLA = CONSTANTS.zeeman.value;

/**
 * The same coefficient in Å⁻¹ G⁻¹ (≈ 4.6686e-13): Δλ[Å] = k g λ[Å]² B[G],
 * since 1 Å = 1e-10 m and 1 G = 1e-4 T.
 * @see CODATA 2018 e, m_e, c
 */
export const ZEEMAN_COEFFICIENT_PER_ANGSTROM_GAUSS = ZEEMAN_COEFFICIENT_PER_M_TESLA * 1e-10 * 1e-4;

function requireLandeG(landeG: number): void {
  requireFinite(landeG, 'lande_g');
  if (landeG === 0) {
    throw new PhysicsError('out_of_range', 'lande_g', 'a line with Landé g = 0 does not split; no field follows from it', 'g ≠ 0');
  }
}

/**
 * Zeeman displacement Δλ in m of a σ component for Landé factor g, a line at
 * a wavelength in m and a field in T: Δλ = g e λ² B / (4π m_e c).
 * @see CODATA 2018 e, m_e, c; REFERENCES.md "Zeeman splitting"
 */
export function zeemanSplittingM(landeG: number, wavelengthM: number, fieldT: number): number {
  requireLandeG(landeG);
  requirePositive(wavelengthM, 'rest_wavelength');
  requireFinite(fieldT, 'magnetic_field');
  return ZEEMAN_COEFFICIENT_PER_M_TESLA * landeG * wavelengthM * wavelengthM * fieldT;
}

/**
 * Field strength in T from a Zeeman displacement in m, Landé g and the rest
 * wavelength in m: B = Δλ / (k g λ²), k = e / (4π m_e c). A negative g gives
 * the magnitude of the field. A displacement of 0 (no splitting seen) is
 * data and gives 0; a negative one is refused. In the trade's units, 1 T = 10⁴ G.
 * @see CODATA 2018 e, m_e, c; REFERENCES.md "Zeeman splitting"
 */
export function magneticFieldT(splittingM: number, landeG: number, restWavelengthM: number): number {
  requireNonNegative(splittingM, 'zeeman_separation');
  requireLandeG(landeG);
  requirePositive(restWavelengthM, 'rest_wavelength');
  return splittingM / (ZEEMAN_COEFFICIENT_PER_M_TESLA * Math.abs(landeG) * restWavelengthM * restWavelengthM);
}

/**
 * Field in T with first-order σ from the partial derivatives,
 * σ_B² = (σ_Δλ / k g λ²)² + (2 B σ_λ / λ)², the relative form
 * (σ_B/B)² = (σ_Δλ/Δλ)² + (2σ_λ/λ)² for Δλ > 0, defined at Δλ = 0 too; g is taken as exact.
 * @see CODATA 2018 e, m_e, c; JCGM 100:2008 (GUM) eq. 10
 */
export function magneticField(splittingM: Measured, landeG: number, restWavelengthM: Measured): Measured {
  const value = magneticFieldT(splittingM.value, landeG, restWavelengthM.value);
  requireUncertainty(splittingM.sigma, 'zeeman_separation');
  requireUncertainty(restWavelengthM.sigma, 'rest_wavelength');
  const perSplitting = 1 / (ZEEMAN_COEFFICIENT_PER_M_TESLA * Math.abs(landeG) * restWavelengthM.value * restWavelengthM.value);
  const perRest = (2 * value) / restWavelengthM.value;
  const sigma = Math.hypot(perSplitting * splittingM.sigma, perRest * restWavelengthM.sigma);
  return { value, sigma: requireFiniteResult(sigma, 'magnetic_field') };
}
