import { CONSTANTS } from './constants';
import { requirePositive } from './errors';
import { powerLaw, type Measured } from './measured';

/**
 * Wien's displacement law, T = b / λmax: effective temperature in K from the
 * wavelength of the continuum peak in m.
 * @see CODATA 2018, Wien wavelength displacement law constant b
 */
export function wienTemperatureK(peakWavelengthM: number): number {
  requirePositive(peakWavelengthM, 'peak_wavelength');
  return CONSTANTS.b.value / peakWavelengthM;
}

/**
 * Wavelength of the maximum of B_λ, in m, for a temperature in K (λmax = b / T).
 * @see CODATA 2018, b
 */
export function wienPeakWavelengthM(temperatureK: number): number {
  requirePositive(temperatureK, 'temperature');
  return CONSTANTS.b.value / temperatureK;
}

/**
 * Wien temperature with first-order uncertainty, σ_T / T = σ_λ / λ.
 * In: peak wavelength in m; out: temperature in K.
 * @see CODATA 2018, b; REFERENCES.md "Wien's displacement law"
 */
export function wienTemperature(peakWavelengthM: Measured): Measured {
  requirePositive(peakWavelengthM.value, 'peak_wavelength');
  return powerLaw(CONSTANTS.b.value, [{ x: peakWavelengthM, power: -1, name: 'peak_wavelength' }], 'temperature_wien');
}
