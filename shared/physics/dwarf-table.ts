import { PhysicsError, requirePositive } from './errors';
import { DWARF_SEQUENCE, type DwarfSequenceRow } from './tables/dwarf-sequence';

/**
 * Interpolation in the mean dwarf sequence, linear in log10 T_eff, shared by
 * the spectral class, the main-sequence luminosity and the radius check.
 */

const LOG_T = Float64Array.from(DWARF_SEQUENCE, (row) => Math.log10(row.teffK));

/** Hottest and coolest temperature of the table, K. */
export const DWARF_TABLE_RANGE_K = Object.freeze({
  min: DWARF_SEQUENCE[DWARF_SEQUENCE.length - 1].teffK,
  max: DWARF_SEQUENCE[0].teffK,
});

const COOLEST_K = DWARF_TABLE_RANGE_K.min;
const HOTTEST_K = DWARF_TABLE_RANGE_K.max;

/** The bracketing rows of a temperature and the weight of the cooler one. */
export interface Bracket {
  readonly hotter: number;
  readonly cooler: number;
  /** 0 at the hotter row, 1 at the cooler row, linear in log T. */
  readonly fraction: number;
}

/**
 * Finds the two table rows around a temperature in K. Throws
 * PhysicsError('out_of_range') outside the table (2330–45900 K), naming
 * `quantity`: the table is never extrapolated.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function bracketTemperature(temperatureK: number, quantity: string): Bracket {
  requirePositive(temperatureK, quantity);
  const { min, max } = DWARF_TABLE_RANGE_K;
  if (temperatureK > max || temperatureK < min) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity}: T = ${Math.round(temperatureK)} K lies outside the dwarf table (${min}–${max} K, M9.5V to O3V)`,
      `${min}–${max} K`,
    );
  }
  const x = Math.log10(temperatureK);
  const lo = hotterRow(x);
  return { hotter: lo, cooler: lo + 1, fraction: fractionTowardsCooler(lo, x) };
}

/** The hotter row of the pair that brackets log10 T = x, for x inside the table. */
function hotterRow(x: number): number {
  let lo = 0;
  let hi = LOG_T.length - 1;
  // LOG_T decreases with index; find hotter = last index with LOG_T >= x.
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (LOG_T[mid] >= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

function fractionTowardsCooler(hotter: number, x: number): number {
  const span = LOG_T[hotter] - LOG_T[hotter + 1];
  return span > 0 ? (LOG_T[hotter] - x) / span : 0;
}

/**
 * A column of the table, by row, for interpolateDwarfColumnUnchecked; taken
 * once, so that a Monte Carlo draw reads numbers instead of calling a
 * function per row.
 */
export function dwarfColumn(column: (row: DwarfSequenceRow) => number): Float64Array {
  return Float64Array.from(DWARF_SEQUENCE, column);
}

/**
 * interpolateDwarfColumn without its checks, for Monte Carlo draws: the
 * same arithmetic, NaN outside the table (2330–45900 K) instead of a throw.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function interpolateDwarfColumnUnchecked(temperatureK: number, column: Float64Array): number {
  if (!(temperatureK >= COOLEST_K && temperatureK <= HOTTEST_K)) return NaN;
  const x = Math.log10(temperatureK);
  const hotter = hotterRow(x);
  const a = column[hotter];
  const b = column[hotter + 1];
  return a + (b - a) * fractionTowardsCooler(hotter, x);
}

/**
 * Interpolates a column of the dwarf table at a temperature in K, linear in
 * log T. Out: the column's own unit.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function interpolateDwarfColumn(temperatureK: number, column: (row: DwarfSequenceRow) => number, quantity: string): number {
  const { hotter, cooler, fraction } = bracketTemperature(temperatureK, quantity);
  const a = column(DWARF_SEQUENCE[hotter]);
  const b = column(DWARF_SEQUENCE[cooler]);
  return a + (b - a) * fraction;
}

/**
 * Slope of a column with respect to log10 T on the table segment that holds
 * a temperature in K (the hotter segment at a row's own temperature), for
 * first-order propagation. Out: column unit per dex of temperature.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function dwarfColumnSlope(temperatureK: number, column: (row: DwarfSequenceRow) => number, quantity: string): number {
  const { hotter, cooler } = bracketTemperature(temperatureK, quantity);
  const span = LOG_T[hotter] - LOG_T[cooler];
  if (!(span > 0)) return 0;
  return (column(DWARF_SEQUENCE[hotter]) - column(DWARF_SEQUENCE[cooler])) / span;
}
