import { airToVacuumM } from './air-vacuum';
import { CONSTANTS } from './constants';
import { requireFiniteResult, requirePositive } from './errors';
import type { Measured } from './measured';

const C = CONSTANTS.c.value;

/** Whether wavelengths were measured in standard air or in vacuum. */
export type WavelengthMedium = 'air' | 'vacuum';

/**
 * Redshift z = (λ_obs − λ_rest) / λ_rest of wavelengths in m measured in the
 * same medium.
 * @see REFERENCES.md "Doppler shift"
 */
export function redshift(observedWavelengthM: number, restWavelengthM: number): number {
  requirePositive(observedWavelengthM, 'line_wavelength');
  requirePositive(restWavelengthM, 'rest_wavelength');
  return (observedWavelengthM - restWavelengthM) / restWavelengthM;
}

/**
 * Classical radial velocity v = c z in m s⁻¹ from wavelengths in m; positive = receding.
 * @see REFERENCES.md "Doppler shift"; CODATA 2018 c
 */
export function classicalRadialVelocityMs(observedWavelengthM: number, restWavelengthM: number): number {
  return C * redshift(observedWavelengthM, restWavelengthM);
}

/**
 * Relativistic line-of-sight velocity v = c ((1+z)² − 1) / ((1+z)² + 1) in
 * m s⁻¹ from wavelengths in m; positive = receding. No barycentric or
 * gravitational-redshift correction.
 * @see REFERENCES.md "Doppler shift"; CODATA 2018 c
 */
export function relativisticRadialVelocityMs(observedWavelengthM: number, restWavelengthM: number): number {
  const ratio = observedWavelengthM / restWavelengthM;
  requirePositive(observedWavelengthM, 'line_wavelength');
  requirePositive(restWavelengthM, 'rest_wavelength');
  const q = ratio * ratio;
  return (C * (q - 1)) / (q + 1);
}

/**
 * Relativistic radial velocity in m s⁻¹ with first-order σ from an observed
 * and a rest wavelength in m (each with σ). Air wavelengths are first
 * converted to vacuum with Morton (2000), so that the ratio is that of
 * vacuum wavelengths; vacuum wavelengths are used as they are.
 * dv/dr = 4 c r / (r² + 1)², r = λ_obs / λ_rest.
 * @see REFERENCES.md "Doppler shift"; Morton (2000), ApJS 130, 403
 */
export function radialVelocity(observedWavelengthM: Measured, restWavelengthM: Measured, medium: WavelengthMedium): Measured {
  const toVacuum = (m: Measured): Measured => {
    if (medium === 'vacuum') return m;
    const v = airToVacuumM(m.value);
    return { value: v, sigma: m.sigma * (v / m.value) };
  };
  const obs = toVacuum(observedWavelengthM);
  const rest = toVacuum(restWavelengthM);
  const value = relativisticRadialVelocityMs(obs.value, rest.value);
  const r = obs.value / rest.value;
  const dvdr = (4 * C * r) / (r * r + 1) ** 2;
  const sigmaR = r * Math.hypot(obs.sigma / obs.value, rest.sigma / rest.value);
  return { value, sigma: requireFiniteResult(Math.abs(dvdr) * sigmaR, 'radial_velocity') };
}
