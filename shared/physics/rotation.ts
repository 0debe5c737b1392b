import { CONSTANTS } from './constants';
import { requirePositive } from './errors';
import { powerLaw, type Measured } from './measured';

/**
 * Equatorial rotation velocity projected on the line of sight, v sin i, in
 * m s⁻¹, from the wavelength separation in m of one line between the
 * approaching and the receding limb and the line's rest wavelength in m:
 * v sin i = c Δλ / (2 λ₀).
 * @see REFERENCES.md "Rotation from the two limbs"; CODATA 2018 c
 */
export function rotationVelocityMs(limbSeparationM: number, restWavelengthM: number): number {
  requirePositive(limbSeparationM, 'limb_separation');
  requirePositive(restWavelengthM, 'rest_wavelength');
  return (CONSTANTS.c.value * limbSeparationM) / (2 * restWavelengthM);
}

/**
 * v sin i with first-order σ: (σ_v/v)² = (σ_Δλ/Δλ)² + (σ_λ₀/λ₀)². In: m, m; out: m s⁻¹.
 * @see REFERENCES.md "Rotation from the two limbs"
 */
export function rotationVelocity(limbSeparationM: Measured, restWavelengthM: Measured): Measured {
  requirePositive(limbSeparationM.value, 'limb_separation');
  requirePositive(restWavelengthM.value, 'rest_wavelength');
  return powerLaw(
    CONSTANTS.c.value / 2,
    [
      { x: limbSeparationM, power: 1, name: 'limb_separation' },
      { x: restWavelengthM, power: -1, name: 'rest_wavelength' },
    ],
    'rotation_velocity',
  );
}
