import { CONSTANTS } from './constants';
import { PhysicsError, requirePositive, type PhysicsWarning } from './errors';
import {
  LUMINOSITY_CLASS_LABELS,
  mainSequenceLogLuminosity,
  mainSequenceLogLuminositySlope,
  mainSequenceLogRadius,
  type LuminosityClassName,
} from './main-sequence';
import type { Measured } from './measured';
import { radiusFromLuminosityM } from './stefan-boltzmann';

/**
 * Luminosity class from a star's place on the HR diagram: its offset from
 * the mean main sequence at its temperature, Δ = log10(L / L_MS(T)) in dex,
 * and its radius. Thresholds are common practice, from memory, and rough:
 * the MK classes are defined by line ratios, not by these numbers.
 */
export const LUMINOSITY_CLASS_THRESHOLDS = Object.freeze({
  /** Below this radius a star is a white dwarf: the smallest dwarf in the table (M9.5V) has 0.101 R☉. */
  whiteDwarfMaxRadiusRsun: 0.05,
  /** Δ below this (dex) is the white-dwarf region, far under the main sequence. */
  whiteDwarfMaxOffsetDex: -1.5,
  /** Δ up to this (dex) is within the main-sequence band. */
  mainSequenceMaxOffsetDex: 0.35,
  /** Δ up to this (dex) is a subgiant; above, a giant or supergiant. */
  subgiantMaxOffsetDex: 1.0,
  /** Above the subgiants, log10(L/L☉) at or above this is a supergiant. */
  supergiantMinLogLsun: 4.0,
});

/** A luminosity class with the offset it rests on. */
export interface LuminosityClassification {
  readonly className: LuminosityClassName;
  readonly label: string;
  /** Δ = log10(L / L_MS(T)) in dex. */
  readonly offsetDex: number;
  readonly radiusRsun: number;
}

/**
 * Classifies a star from its effective temperature in K and luminosity in W
 * (its radius follows by Stefan–Boltzmann). T must lie inside the dwarf
 * table (2330–45900 K), else PhysicsError('out_of_range'): the offset from the
 * main sequence is not extrapolated.
 * @see LUMINOSITY_CLASS_THRESHOLDS (common practice, from memory); Pecaut & Mamajek (2013), ApJS 208, 9
 */
export function classifyLuminosity(temperatureK: number, luminosityW: number): LuminosityClassification {
  requirePositive(temperatureK, 'temperature');
  requirePositive(luminosityW, 'luminosity');
  const t = LUMINOSITY_CLASS_THRESHOLDS;
  const radiusRsun = radiusFromLuminosityM(luminosityW, temperatureK) / CONSTANTS.R_sun.value;
  const logL = Math.log10(luminosityW / CONSTANTS.L_sun.value);
  const offsetDex = logL - mainSequenceLogLuminosity(temperatureK, 'luminosity_class');
  let className: LuminosityClassName;
  if (radiusRsun < t.whiteDwarfMaxRadiusRsun || offsetDex < t.whiteDwarfMaxOffsetDex) className = 'white_dwarf';
  else if (offsetDex <= t.mainSequenceMaxOffsetDex) className = 'main_sequence';
  else if (offsetDex <= t.subgiantMaxOffsetDex) className = 'subgiant';
  else if (logL >= t.supergiantMinLogLsun) className = 'supergiant';
  else className = 'giant';
  return { className, label: LUMINOSITY_CLASS_LABELS[className], offsetDex, radiusRsun };
}

/**
 * Classification with the offset's first-order σ (dex):
 * σ_Δ² = (σ_L / (L ln 10))² + (slope σ_T / (T ln 10))², slope = d log L_MS / d log T.
 * @see classifyLuminosity
 */
export function luminosityClass(temperatureK: Measured, luminosityW: Measured): LuminosityClassification & { readonly offset: Measured } {
  const cls = classifyLuminosity(temperatureK.value, luminosityW.value);
  const slope = mainSequenceLogLuminositySlope(temperatureK.value, 'luminosity_class');
  const sigma = Math.hypot(luminosityW.sigma / luminosityW.value, (slope * temperatureK.sigma) / temperatureK.value) / Math.LN10;
  return { className: cls.className, label: cls.label, offsetDex: cls.offsetDex, radiusRsun: cls.radiusRsun, offset: { value: cls.offsetDex, sigma } };
}

/**
 * Radii, in R☉, that are plausible for each class. The main sequence is
 * judged against the dwarf table's radius at the star's temperature (within
 * a factor 2); the others by broad ranges. Common practice, from memory.
 */
export const PLAUSIBLE_RADIUS = Object.freeze({
  mainSequenceFactor: 2,
  subgiant: { min: 1, max: 10 },
  giant: { min: 3, max: 300 },
  supergiant: { min: 20, max: 2000 },
  white_dwarf: { min: 0.005, max: 0.03 },
});

/**
 * Warning when a radius in m is implausible for the assumed class at a
 * temperature in K (the class assumption behind the spectroscopic distance).
 * @see PLAUSIBLE_RADIUS (common practice, from memory); Pecaut & Mamajek (2013), ApJS 208, 9
 */
export function radiusPlausibilityWarnings(radiusM: number, temperatureK: number, assumedClass: LuminosityClassName): PhysicsWarning[] {
  const radiusRsun = radiusM / CONSTANTS.R_sun.value;
  let min: number;
  let max: number;
  if (assumedClass === 'main_sequence') {
    let typical: number;
    try {
      typical = Math.pow(10, mainSequenceLogRadius(temperatureK, 'radius'));
    } catch (error) {
      if (error instanceof PhysicsError) return [];
      throw error;
    }
    min = typical / PLAUSIBLE_RADIUS.mainSequenceFactor;
    max = typical * PLAUSIBLE_RADIUS.mainSequenceFactor;
  } else {
    ({ min, max } = PLAUSIBLE_RADIUS[assumedClass]);
  }
  if (radiusRsun >= min && radiusRsun <= max) return [];
  return [
    {
      code: 'radius_implausible_for_class',
      quantity: 'radius',
      message: `radius ${radiusRsun.toPrecision(3)} R☉ lies outside ${min.toPrecision(2)}–${max.toPrecision(2)} R☉, the range for the assumed class ${LUMINOSITY_CLASS_LABELS[assumedClass]} at ${Math.round(temperatureK)} K`,
      limit: `${min.toPrecision(2)}–${max.toPrecision(2)} R☉`,
    },
  ];
}
