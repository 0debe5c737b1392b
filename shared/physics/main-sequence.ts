import { CONSTANTS } from './constants';
import { dwarfColumnSlope, interpolateDwarfColumn } from './dwarf-table';
import { requirePositive } from './errors';
import { distanceFromLuminosityM } from './inverse-square';
import type { Measured } from './measured';
import { monteCarlo, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';

/**
 * Main-sequence luminosity at a temperature, and the luminosity of a star of
 * an assumed luminosity class: the spectroscopic-parallax route.
 */

/** The luminosity classes Starledger distinguishes. */
export const LUMINOSITY_CLASSES = ['main_sequence', 'subgiant', 'giant', 'supergiant', 'white_dwarf'] as const;
export type LuminosityClassName = (typeof LUMINOSITY_CLASSES)[number];

/** Human names with the MK numeral. */
export const LUMINOSITY_CLASS_LABELS: Readonly<Record<LuminosityClassName, string>> = Object.freeze({
  main_sequence: 'main sequence (V)',
  subgiant: 'subgiant (IV)',
  giant: 'giant (III)',
  supergiant: 'supergiant (I)',
  white_dwarf: 'white dwarf (D)',
});

/**
 * How the luminosity of an assumed class is modelled:
 * - `table_offset`: log L = log L_MS(T) from the dwarf table + offsetDex,
 *   with an intrinsic scatter (σ, dex) for the spread of real stars;
 * - `radius`: L = 4π R² σ T⁴ at a typical radius, with a scatter in log R.
 */
export type AssumedClassModel =
  | { readonly kind: 'table_offset'; readonly offsetDex: number; readonly scatterDex: number }
  | { readonly kind: 'radius'; readonly radiusRsun: number; readonly scatterDex: number };

/**
 * The models per class. Common practice, from memory, and rough: the
 * main-sequence band is a few tenths of a dex wide in L at one temperature
 * (age, metallicity); subgiants sit some 0.5 dex above it; giants,
 * supergiants and white dwarfs are better described by a typical radius
 * (about 10, 100 and 0.013 R☉) than by an offset, because their offset from
 * the main sequence changes strongly with temperature. The scatter enters the
 * Monte Carlo, so a spectroscopic distance carries the assumption's spread.
 */
export const ASSUMED_CLASS_MODELS: Readonly<Record<LuminosityClassName, AssumedClassModel>> = Object.freeze({
  main_sequence: { kind: 'table_offset', offsetDex: 0, scatterDex: 0.15 },
  subgiant: { kind: 'table_offset', offsetDex: 0.5, scatterDex: 0.25 },
  giant: { kind: 'radius', radiusRsun: 10, scatterDex: 0.3 },
  supergiant: { kind: 'radius', radiusRsun: 100, scatterDex: 0.5 },
  white_dwarf: { kind: 'radius', radiusRsun: 0.013, scatterDex: 0.1 },
});

/**
 * log10(L_MS / L☉) of the mean dwarf sequence at a temperature in K,
 * linear in log T between rows. Throws PhysicsError('out_of_range') outside
 * 2330–45900 K.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function mainSequenceLogLuminosity(temperatureK: number, quantity = 'luminosity_hr'): number {
  return interpolateDwarfColumn(temperatureK, (row) => row.logLLsun, quantity);
}

/**
 * d log10(L_MS/L☉) / d log10 T on the table segment holding a temperature in K.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5
 */
export function mainSequenceLogLuminositySlope(temperatureK: number, quantity = 'luminosity_hr'): number {
  return dwarfColumnSlope(temperatureK, (row) => row.logLLsun, quantity);
}

/**
 * log10(R_MS / R☉) of the mean dwarf sequence at a temperature in K.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5
 */
export function mainSequenceLogRadius(temperatureK: number, quantity = 'radius'): number {
  return interpolateDwarfColumn(temperatureK, (row) => Math.log10(row.radiusRsun), quantity);
}

const LOG_SIGMA_SB_4PI = Math.log10(4 * Math.PI * CONSTANTS.sigma.value);
const L_SUN_W = CONSTANTS.L_sun.value;
const LOG_L_SUN = Math.log10(L_SUN_W);
const LOG_R_SUN = Math.log10(CONSTANTS.R_sun.value);

/**
 * log10(L / L☉) of a star of an assumed class at a temperature in K, shifted
 * by `deviationDex` (the draw of the class's intrinsic scatter; 0 for the
 * typical star).
 * @see ASSUMED_CLASS_MODELS (common practice, from memory); Pecaut & Mamajek (2013); CODATA 2018 σ
 */
export function assumedClassLogLuminosity(temperatureK: number, assumedClass: LuminosityClassName, deviationDex = 0): number {
  requirePositive(temperatureK, 'temperature');
  const model = ASSUMED_CLASS_MODELS[assumedClass];
  if (model.kind === 'table_offset') return mainSequenceLogLuminosity(temperatureK) + model.offsetDex + deviationDex;
  return radiusModelLogLuminosity(temperatureK, model.radiusRsun, deviationDex);
}

function radiusModelLogLuminosity(temperatureK: number, radiusRsun: number, deviationDex: number): number {
  const logR = Math.log10(radiusRsun) + LOG_R_SUN + deviationDex;
  return LOG_SIGMA_SB_4PI + 2 * logR + 4 * Math.log10(temperatureK) - LOG_L_SUN;
}

/**
 * Luminosity in W of a star of the assumed class at a temperature in K (with
 * σ), with σ from a seeded Monte Carlo over T and the class's intrinsic
 * scatter (the table is piecewise in log T and the scatter is in dex, so L is
 * far from linear in the inputs).
 * @see ASSUMED_CLASS_MODELS; Pecaut & Mamajek (2013); JCGM 101:2008
 */
export function assumedClassLuminosity(
  temperatureK: Measured,
  assumedClass: LuminosityClassName,
  options: MonteCarloOptions = {},
): MonteCarloResult {
  const scatter = { value: 0, sigma: ASSUMED_CLASS_MODELS[assumedClass].scatterDex };
  return monteCarlo(
    (x) => L_SUN_W * Math.pow(10, assumedClassLogLuminosity(x[0], assumedClass, x[1])),
    [temperatureK, scatter],
    'luminosity_hr',
    options,
  );
}

/**
 * Photometric (spectroscopic-parallax) distance in m: d = √(L / 4π F) with L
 * the luminosity of the assumed class at temperature T (K) and F the
 * bolometric flux (W m⁻²), σ from a seeded Monte Carlo over T, the class's
 * scatter and F. Only as good as the class assumption.
 * @see REFERENCES.md "Inverse-square law", "Limits of the simple models"; ASSUMED_CLASS_MODELS
 */
export function photometricDistance(
  temperatureK: Measured,
  assumedClass: LuminosityClassName,
  fluxWm2: Measured,
  options: MonteCarloOptions = {},
): MonteCarloResult {
  requirePositive(fluxWm2.value, 'bolometric_flux');
  const scatter = { value: 0, sigma: ASSUMED_CLASS_MODELS[assumedClass].scatterDex };
  return monteCarlo(
    (x) => distanceFromLuminosityM(L_SUN_W * Math.pow(10, assumedClassLogLuminosity(x[0], assumedClass, x[1])), x[2]),
    [temperatureK, scatter, fluxWm2],
    'distance_photometric',
    options,
  );
}
