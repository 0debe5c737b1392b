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

/** The classes in order of luminosity at one temperature, faintest first. */
const CLASS_ORDER: readonly LuminosityClassName[] = ['white_dwarf', 'main_sequence', 'subgiant', 'giant', 'supergiant'];

/**
 * At and above this temperature (the B and O stars: the coarse B/A boundary
 * of 10 000 K, common practice) subgiants and giants are not told apart by
 * the offset: B giants lie only about 0.4–0.6 dex above the mean dwarf
 * sequence (M_V of B0–B5 III about 1.0–1.4 mag brighter than V; Schmidt-Kaler
 * 1982, from memory), inside the offset band of subgiants, while at G and K
 * the giants lie 1.5–2 dex up. The fixed offset thresholds are the source's
 * limit there, so a hot star in the subgiant band is "subgiant or giant".
 */
export const HOT_STAR_MIN_TEMPERATURE_K = 10_000;

/** The upper boundary of a class (towards the next brighter one) in words, as a warning's limit names it. */
function boundaryWords(fainter: LuminosityClassName): string {
  const t = LUMINOSITY_CLASS_THRESHOLDS;
  if (fainter === 'white_dwarf') return `Δ = ${t.whiteDwarfMaxOffsetDex} dex or R = ${t.whiteDwarfMaxRadiusRsun} R☉`;
  if (fainter === 'main_sequence') return `Δ = ${t.mainSequenceMaxOffsetDex} dex`;
  if (fainter === 'subgiant') return `Δ = ${t.subgiantMaxOffsetDex.toFixed(1)} dex`;
  return `log L/L☉ = ${t.supergiantMinLogLsun.toFixed(1)}`;
}

/** Steps across ±1σ at which the class is read (σ/20 apart): fine enough that no class between the ends is missed. */
const SCAN_STEPS = 20;

/** A classification that names every class within 1σ, with the warning that says so. */
export interface LuminosityClassVerdict extends LuminosityClassification {
  /** Every class the star may be in, faintest first; one when the 1σ range stays inside a class. */
  readonly candidates: readonly LuminosityClassName[];
  readonly warnings: PhysicsWarning[];
}

/**
 * Classifies as classifyLuminosity does, and reads the class again across
 * Δ ± σ_Δ (moving L by 10^(±σ_Δ) at the same T). When the range crosses a
 * boundary, the label names each class ("main sequence (V) or subgiant (IV),
 * within 1σ of the class boundary") and a `class_boundary` warning names the
 * boundary; a hot star (HOT_STAR_MIN_TEMPERATURE_K) in the subgiant band is
 * "subgiant or giant" for the reason given there. `className` stays the
 * class at the nominal values.
 * @see LUMINOSITY_CLASS_THRESHOLDS (common practice, from memory); HOT_STAR_MIN_TEMPERATURE_K
 */
export function luminosityClassWithin(temperatureK: number, luminosityW: number, offsetSigmaDex: number): LuminosityClassVerdict {
  const nominal = classifyLuminosity(temperatureK, luminosityW);
  const found = new Set<LuminosityClassName>([nominal.className]);
  if (Number.isFinite(offsetSigmaDex) && offsetSigmaDex > 0) {
    for (let k = -SCAN_STEPS; k <= SCAN_STEPS; k++) {
      found.add(classifyLuminosity(temperatureK, luminosityW * Math.pow(10, (k / SCAN_STEPS) * offsetSigmaDex)).className);
    }
  }
  const hotOverlap = temperatureK >= HOT_STAR_MIN_TEMPERATURE_K && found.has('subgiant') && !found.has('giant');
  if (hotOverlap) found.add('giant');
  const candidates = CLASS_ORDER.filter((c) => found.has(c));
  if (candidates.length === 1) return { ...nominal, candidates, warnings: [] };
  const names = candidates.map((c) => LUMINOSITY_CLASS_LABELS[c]);
  const either = `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`;
  const boundaries: string[] = [];
  for (let i = 1; i < candidates.length; i++) {
    if (!(hotOverlap && candidates[i] === 'giant')) boundaries.push(boundaryWords(candidates[i - 1]));
  }
  const reasons: string[] = [];
  if (boundaries.length > 0) reasons.push(`within 1σ (${offsetSigmaDex.toFixed(2)} dex) of the class boundary`);
  if (hotOverlap) reasons.push(`at ${Math.round(temperatureK)} K subgiants and giants lie within a few tenths of a dex of each other`);
  const limit = boundaries.length > 0 ? boundaries.join('; ') : `T ≥ ${HOT_STAR_MIN_TEMPERATURE_K} K`;
  return {
    ...nominal,
    label: `${either}, ${reasons.join('; ')}`,
    candidates,
    warnings: [
      {
        code: 'class_boundary',
        quantity: 'luminosity_class',
        message: `the offset Δ = ${nominal.offsetDex.toFixed(2)} ± ${offsetSigmaDex.toFixed(2)} dex does not settle the class: ${either} (${reasons.join('; ')})`,
        limit,
      },
    ],
  };
}

/**
 * True when a luminosity-class label (one class, or "a or b, …") names the class.
 * @see luminosityClassWithin
 */
export function labelNamesClass(label: string, className: LuminosityClassName): boolean {
  const wanted = LUMINOSITY_CLASS_LABELS[className];
  return label.split(/, | or |; /).some((part) => part === wanted);
}

/**
 * Classification with the offset's first-order σ (dex):
 * σ_Δ² = (σ_L / (L ln 10))² + (slope σ_T / (T ln 10))², slope = d log L_MS / d log T;
 * the label names every class within 1σ (luminosityClassWithin).
 * @see classifyLuminosity
 */
export function luminosityClass(temperatureK: Measured, luminosityW: Measured): LuminosityClassVerdict & { readonly offset: Measured } {
  const slope = mainSequenceLogLuminositySlope(temperatureK.value, 'luminosity_class');
  const sigma = Math.hypot(luminosityW.sigma / luminosityW.value, (slope * temperatureK.sigma) / temperatureK.value) / Math.LN10;
  const cls = luminosityClassWithin(temperatureK.value, luminosityW.value, sigma);
  return { ...cls, offset: { value: cls.offsetDex, sigma } };
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
