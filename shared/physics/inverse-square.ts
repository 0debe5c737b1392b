import { requirePositive } from './errors';
import { powerLaw, type Measured } from './measured';

const FOUR_PI = 4 * Math.PI;

/**
 * Luminosity in W from a bolometric flux in W m⁻² at a distance in m: L = 4π d² F.
 * @see REFERENCES.md "Inverse-square law"
 */
export function luminosityFromFluxW(fluxWm2: number, distanceM: number): number {
  requirePositive(fluxWm2, 'bolometric_flux');
  requirePositive(distanceM, 'distance');
  return FOUR_PI * distanceM * distanceM * fluxWm2;
}

/**
 * Bolometric flux in W m⁻² at a distance in m from a luminosity in W: F = L / (4π d²).
 * @see REFERENCES.md "Inverse-square law"; check: L☉ at 1 au = 1361 W m⁻² (IAU 2015 B3)
 */
export function fluxFromLuminosityWm2(luminosityW: number, distanceM: number): number {
  requirePositive(luminosityW, 'luminosity');
  requirePositive(distanceM, 'distance');
  return luminosityW / (FOUR_PI * distanceM * distanceM);
}

/**
 * Distance in m at which a luminosity in W gives a flux in W m⁻²: d = √(L / 4π F).
 * @see REFERENCES.md "Inverse-square law"
 */
export function distanceFromLuminosityM(luminosityW: number, fluxWm2: number): number {
  requirePositive(luminosityW, 'luminosity');
  requirePositive(fluxWm2, 'bolometric_flux');
  return Math.sqrt(luminosityW / (FOUR_PI * fluxWm2));
}

/**
 * L = 4π d² F with first-order σ: (σ_L/L)² = (σ_F/F)² + (2σ_d/d)². In: W m⁻², m; out: W.
 * @see REFERENCES.md "Inverse-square law", "Uncertainties"
 */
export function luminosityFromFlux(fluxWm2: Measured, distanceM: Measured): Measured {
  requirePositive(fluxWm2.value, 'bolometric_flux');
  requirePositive(distanceM.value, 'distance');
  return powerLaw(
    FOUR_PI,
    [
      { x: fluxWm2, power: 1, name: 'bolometric_flux' },
      { x: distanceM, power: 2, name: 'distance' },
    ],
    'luminosity',
  );
}

/**
 * d = √(L / 4π F) with first-order σ: (σ_d/d)² = (σ_L/2L)² + (σ_F/2F)². In: W, W m⁻²; out: m.
 * @see REFERENCES.md "Inverse-square law", "Uncertainties"
 */
export function distanceFromLuminosity(luminosityW: Measured, fluxWm2: Measured): Measured {
  requirePositive(luminosityW.value, 'luminosity');
  requirePositive(fluxWm2.value, 'bolometric_flux');
  return powerLaw(
    1 / Math.sqrt(FOUR_PI),
    [
      { x: luminosityW, power: 0.5, name: 'luminosity' },
      { x: fluxWm2, power: -0.5, name: 'bolometric_flux' },
    ],
    'distance',
  );
}
