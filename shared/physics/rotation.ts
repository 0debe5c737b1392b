import { CONSTANTS } from './constants';
import { PhysicsError, requireFiniteResult, requireNonNegative, requirePositive, requireUncertainty } from './errors';
import type { Measured } from './measured';

/**
 * Equatorial rotation velocity projected on the line of sight, v sin i, in
 * m s⁻¹, from the wavelength separation in m of one line between the
 * approaching and the receding limb and the line's rest wavelength in m:
 * v sin i = c Δλ / (2 λ₀). A separation of 0 (no broadening seen) is data
 * and gives 0; a negative one, or one of 2 λ₀ or more (v ≥ c), is refused.
 * @see REFERENCES.md "Rotation from the two limbs"; CODATA 2018 c
 */
export function rotationVelocityMs(limbSeparationM: number, restWavelengthM: number): number {
  requireNonNegative(limbSeparationM, 'limb_separation');
  requirePositive(restWavelengthM, 'rest_wavelength');
  // Δλ ≥ 2 λ₀ would make the limbs move at or faster than light.
  if (limbSeparationM >= 2 * restWavelengthM) {
    throw new PhysicsError(
      'unphysical',
      'rotation_velocity',
      `a separation of ${limbSeparationM.toPrecision(3)} m between the limbs of a line at ${restWavelengthM.toPrecision(4)} m would mean v sin i ≥ c`,
      'Δλ < 2 λ₀ (v < c)',
    );
  }
  return (CONSTANTS.c.value * limbSeparationM) / (2 * restWavelengthM);
}

/**
 * v sin i with first-order σ from the partial derivatives,
 * σ_v² = (c σ_Δλ / 2λ₀)² + (c Δλ σ_λ₀ / 2λ₀²)², which is the relative form
 * (σ_v/v)² = (σ_Δλ/Δλ)² + (σ_λ₀/λ₀)² for Δλ > 0 and stays defined at Δλ = 0.
 * In: m, m; out: m s⁻¹.
 * @see REFERENCES.md "Rotation from the two limbs"; JCGM 100:2008 (GUM) eq. 10
 */
export function rotationVelocity(limbSeparationM: Measured, restWavelengthM: Measured): Measured {
  const value = rotationVelocityMs(limbSeparationM.value, restWavelengthM.value);
  requireUncertainty(limbSeparationM.sigma, 'limb_separation');
  requireUncertainty(restWavelengthM.sigma, 'rest_wavelength');
  const perSeparation = CONSTANTS.c.value / (2 * restWavelengthM.value);
  const perRest = value / restWavelengthM.value;
  const sigma = Math.hypot(perSeparation * limbSeparationM.sigma, perRest * restWavelengthM.sigma);
  return { value, sigma: requireFiniteResult(sigma, 'rotation_velocity') };
}
