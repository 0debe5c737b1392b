import { CONSTANTS } from './constants';
import { dwarfColumnSlope, DwarfColumn, interpolateDwarfColumn } from './dwarf-table';
import { requirePositive } from './errors';
import { FAST_LOG10_ERROR, Log10Grid } from './fast-log10';
import type { Measured } from './measured';
import { monteCarlo, type DrawModel, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';

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
/** The dwarf table's log L, ready for Monte Carlo draws. */
const LOG_L_COLUMN = new DwarfColumn((row) => row.logLLsun);

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
 * assumedClassLogLuminosity without its checks, for Monte Carlo draws: the
 * same arithmetic, NaN where it would throw.
 */
function assumedClassLogLuminosityUnchecked(temperatureK: number, model: AssumedClassModel, deviationDex: number): number {
  if (!(temperatureK > 0)) return Number.NaN;
  if (model.kind === 'table_offset') return LOG_L_COLUMN.unchecked(temperatureK) + model.offsetDex + deviationDex;
  return radiusModelLogLuminosity(temperatureK, model.radiusRsun, deviationDex);
}

/**
 * log10(L/L☉) of a class model for ranking draws: as the unchecked one, NaN
 * in the same places, but from the table's per-kelvin chords or the fast
 * logarithm, so off by at most LOG_L_RANK_ERROR. `logRadius` is logRadiusM(model).
 */
function rankLogLuminosity(temperatureK: number, model: AssumedClassModel, logRadius: number, deviationDex: number): number {
  if (model.kind === 'table_offset') return LOG_L_COLUMN.fast(temperatureK) + model.offsetDex + deviationDex;
  if (!(temperatureK > 0)) return Number.NaN;
  return LOG_SIGMA_SB_4PI + 2 * (logRadius + deviationDex) + 4 * LOG_L_COLUMN.fastLog10Temperature(temperatureK) - LOG_L_SUN;
}

/** log10(R/m) of a radius model's typical star (unused by the table models). */
function logRadiusM(model: AssumedClassModel): number {
  return model.kind === 'radius' ? Math.log10(model.radiusRsun) + LOG_R_SUN : 0;
}

/**
 * How far a ranked log10(L/L☉), or a ranked log L − log F, may lie from the
 * exactly computed one, in dex: the table's per-kelvin chords' error (3·10⁻⁷
 * dex, DwarfColumn.fastError) or 4 fast logarithms' for T⁴, plus two more
 * for log F and F / F_nominal's rounding, plus the rounding of a few sums of
 * numbers below 300; four times the last three, for margin. The draws of a
 * star lie some 10⁻⁴ dex apart, so an order statistic seldom has another
 * within reach and needs settling by values.
 */
const LOG_L_RANK_ERROR = Math.max(LOG_L_COLUMN.fastError, 16 * FAST_LOG10_ERROR) + 4 * (2 * FAST_LOG10_ERROR + 1e-12);

/**
 * Below this log10(L/L☉) the luminosity in W is surely finite (the largest
 * double is 10^308.25 and L☉ 10^26.58); above it, rare as it is, a rank
 * asks the luminosity itself.
 */
const SAFE_LOG_LSUN = 250;
/**
 * Above this flux, in W m⁻², L / 4πF stays finite while log10(L/L☉) stays
 * below SAFE_LOG_LSUN: L < 10^276.6 W and 4πF > 10^-28.9 W m⁻² give less
 * than 10^305.5 m². Measured stars are brighter by many orders of magnitude.
 */
const SAFE_FLUX_WM2 = 1e-30;
/** Ratios of a drawn flux to the nominal one, where nearly all draws fall: their fast logarithms. */
const FLUX_RATIO_GRID = new Log10Grid(1 / 4, 4, 1 / 512);

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
  const model = ASSUMED_CLASS_MODELS[assumedClass];
  const scatter = { value: 0, sigma: model.scatterDex };
  const logRadius = logRadiusM(model);
  const luminosity = (t: number, deviation: number): number => L_SUN_W * Math.pow(10, assumedClassLogLuminosityUnchecked(t, model, deviation));
  // L grows with log L, so the draws are ranked by the logarithm and the
  // power of ten is taken for the few draws the interval is read from.
  const draws: DrawModel = {
    rank: (draws) => {
      for (let s = 0; s < draws.count; s++) {
        const t = draws.input(0, s);
        const deviation = draws.input(1, s);
        const logL = rankLogLuminosity(t, model, logRadius, deviation);
        draws.keep(s, logL > SAFE_LOG_LSUN && !Number.isFinite(luminosity(t, deviation)) ? Number.NaN : logL);
      }
    },
    rankError: LOG_L_RANK_ERROR,
    value: (x) => luminosity(x[0], x[1]),
  };
  return monteCarlo(
    (x) => L_SUN_W * Math.pow(10, assumedClassLogLuminosity(x[0], assumedClass, x[1])),
    [temperatureK, scatter],
    'luminosity_hr',
    options,
    draws,
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
  const model = ASSUMED_CLASS_MODELS[assumedClass];
  const scatter = { value: 0, sigma: model.scatterDex };
  const logRadius = logRadiusM(model);
  const fourPi = 4 * Math.PI;
  const distance = (t: number, deviation: number, flux: number): number => {
    if (!(flux > 0)) return Number.NaN;
    const luminosity = L_SUN_W * Math.pow(10, assumedClassLogLuminosityUnchecked(t, model, deviation));
    return Math.sqrt(luminosity / (fourPi * flux));
  };
  // d = √(L☉ / 4π) 10^((log L − log F) / 2) grows with log L − log F, and
  // so with log L − log(F / F_nominal), which ranks the draws with two fast
  // logarithms instead of a logarithm, a power, a quotient and a root. Far
  // from ordinary fluxes and luminosities, where a step could overflow, the
  // distance itself decides whether a draw counts.
  const perNominalFlux = 1 / fluxWm2.value;
  const draws: DrawModel = {
    rank: (draws) => {
      for (let s = 0; s < draws.count; s++) {
        const t = draws.input(0, s);
        const deviation = draws.input(1, s);
        const f = draws.input(2, s);
        const logL = f > 0 ? rankLogLuminosity(t, model, logRadius, deviation) : Number.NaN;
        const overflows = (logL > SAFE_LOG_LSUN || f < SAFE_FLUX_WM2) && !Number.isFinite(distance(t, deviation, f));
        draws.keep(s, overflows ? Number.NaN : logL - FLUX_RATIO_GRID.log10(f * perNominalFlux));
      }
    },
    rankError: LOG_L_RANK_ERROR,
    value: (x) => distance(x[0], x[1], x[2]),
  };
  return monteCarlo(
    (x) => {
      requirePositive(x[2], 'bolometric_flux');
      const luminosity = L_SUN_W * Math.pow(10, assumedClassLogLuminosity(x[0], assumedClass, x[1]));
      return Math.sqrt(luminosity / (fourPi * x[2]));
    },
    [temperatureK, scatter, fluxWm2],
    'distance_photometric',
    options,
    draws,
  );
}
