import { PhysicsError, requirePositive } from './errors';

/**
 * Below 2000 Å wavelengths are quoted in vacuum only, and Morton's formula is
 * not used there (common practice).
 * @see Morton (2000), ApJS 130, 403
 */
export const AIR_WAVELENGTH_MIN_M = 2000e-10;

function checkRange(wavelengthM: number, quantity: string): void {
  requirePositive(wavelengthM, quantity);
  if (wavelengthM < AIR_WAVELENGTH_MIN_M) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity} ${(wavelengthM * 1e10).toFixed(1)} Å is below 2000 Å, where air wavelengths are not used`,
      '≥ 2000 Å',
    );
  }
}

/**
 * Refractive index of standard air at a vacuum wavelength in m:
 * n = 1 + 8.34254e-5 + 2.406147e-2 / (130 − s²) + 1.5998e-4 / (38.9 − s²),
 * s = 10⁴ / λ_vac[Å] (s in µm⁻¹).
 * @see Morton (2000), ApJS 130, 403 (the IAU standard)
 */
export function airRefractiveIndex(vacuumWavelengthM: number): number {
  checkRange(vacuumWavelengthM, 'wavelength');
  const s = 1e4 / (vacuumWavelengthM * 1e10);
  const s2 = s * s;
  return 1 + 8.34254e-5 + 2.406147e-2 / (130 - s2) + 1.5998e-4 / (38.9 - s2);
}

/**
 * Air wavelength in m from a vacuum wavelength in m: λ_air = λ_vac / n(λ_vac).
 * @see Morton (2000), ApJS 130, 403
 */
export function vacuumToAirM(vacuumWavelengthM: number): number {
  return vacuumWavelengthM / airRefractiveIndex(vacuumWavelengthM);
}

/**
 * Vacuum wavelength in m from an air wavelength in m, by iterating
 * λ_vac = λ_air n(λ_vac) to 1e-15 relative (a few steps).
 * @see Morton (2000), ApJS 130, 403
 */
export function airToVacuumM(airWavelengthM: number): number {
  checkRange(airWavelengthM, 'wavelength');
  let vacuum = airWavelengthM;
  for (let i = 0; i < 20; i++) {
    const next = airWavelengthM * airRefractiveIndex(vacuum);
    if (Math.abs(next - vacuum) <= 1e-15 * next) return next;
    vacuum = next;
  }
  return vacuum;
}
