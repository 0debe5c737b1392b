import { PhysicsError, requirePositive } from './errors';
import { fastLog10Each, log10Grid } from './fast-log10';
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
  const lo = hotterRow(temperatureK, x);
  return { hotter: lo, cooler: lo + 1, fraction: fractionTowardsCooler(lo, x) };
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

const LAST_ROW = LOG_T.length - 1;
const TEFF_K = Float64Array.from(DWARF_SEQUENCE, (row) => row.teffK);

/**
 * Cells of 16 K over the table's range, for finding a temperature's rows
 * without a search and for the fast logarithm of the draws. 16 K is finer
 * than the closest pair of rows (20 K apart), so a cell holds at most one.
 */
const CELL_K = 16;
const TEMPERATURE_GRID = log10Grid(COOLEST_K, HOTTEST_K, CELL_K);

/** The cell of a temperature in K inside the table. */
function cellOf(temperatureK: number): number {
  return ((temperatureK - COOLEST_K) / CELL_K) | 0;
}

/** hotterRow by binary search; builds the index below. */
function hotterRowBySearch(x: number): number {
  let lo = 0;
  let hi = LAST_ROW;
  // LOG_T decreases with index; find hotter = last index with LOG_T >= x.
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (LOG_T[mid] >= x) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * For each cell, the hotter row at a temperature a little above the cell's
 * top: no temperature in the cell has an earlier one, so the search for a
 * temperature's rows only steps on from it (at most one row).
 */
const ROW_AT_CELL_TOP = Int32Array.from({ length: cellOf(HOTTEST_K) + 1 }, (_, cell) =>
  hotterRowBySearch(Math.log10(COOLEST_K + (cell + 1) * CELL_K + 1)),
);

/**
 * The hotter row of the pair that brackets log10 T = x: the last row with
 * log T ≥ x, never the coolest row itself; the same answer as a binary
 * search, found from the temperature's cell (Monte Carlo draws ask
 * thousands of times per target). T must lie inside the table.
 */
function hotterRow(temperatureK: number, x: number): number {
  let row = ROW_AT_CELL_TOP[cellOf(temperatureK)];
  while (row < LAST_ROW - 1 && LOG_T[row + 1] >= x) row++;
  return row;
}

function fractionTowardsCooler(hotter: number, x: number): number {
  const span = LOG_T[hotter] - LOG_T[hotter + 1];
  return span > 0 ? (LOG_T[hotter] - x) / span : 0;
}

/**
 * A column of the table, by row, for the interpolations below; taken once,
 * so that a Monte Carlo draw reads numbers instead of calling a function per row.
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
  if (!(temperatureK >= COOLEST_K && temperatureK <= HOTTEST_K)) return Number.NaN;
  const x = Math.log10(temperatureK);
  const hotter = hotterRow(temperatureK, x);
  const a = column[hotter];
  const b = column[hotter + 1];
  return a + (b - a) * fractionTowardsCooler(hotter, x);
}

/**
 * The slope of a column per dex of log T on each segment (row to the next
 * cooler one), for interpolateDwarfColumnFast; 0 on a segment of no width.
 */
export function dwarfColumnSlopes(column: Float64Array): Float64Array {
  return Float64Array.from({ length: LAST_ROW }, (_, row) => {
    const span = LOG_T[row] - LOG_T[row + 1];
    return span > 0 ? (column[row + 1] - column[row]) / (LOG_T[row + 1] - LOG_T[row]) : 0;
  });
}

/**
 * A column at each of the first n temperatures in K, for ranking Monte Carlo
 * draws: the same line as interpolateDwarfColumnUnchecked (NaN outside the
 * table), but on the fast logarithm and the segment's slope, in one loop
 * over the draws. Each result is off from the unchecked one by at most twice
 * the steepest slope times FAST_LOG10_ERROR (twice, for a draw whose
 * segment is the neighbour of the exact one, next to a row), plus rounding.
 * @see Pecaut & Mamajek (2013), ApJS 208, 9, Table 5 (Mamajek's version 2024.05.15)
 */
export function interpolateDwarfColumnFast(temperatureK: Float64Array, n: number, column: Float64Array, slopes: Float64Array, out: Float64Array): void {
  fastLog10Each(TEMPERATURE_GRID, temperatureK, 1, n, out);
  for (let s = 0; s < n; s++) {
    const t = temperatureK[s];
    if (!(t >= COOLEST_K && t <= HOTTEST_K)) {
      out[s] = Number.NaN;
      continue;
    }
    const x = out[s];
    // The rows by temperature, not by the approximate logarithm: either way
    // the line is continuous across a row, which the error bound allows for.
    let hotter = ROW_AT_CELL_TOP[cellOf(t)];
    while (hotter < LAST_ROW - 1 && TEFF_K[hotter + 1] >= t) hotter++;
    out[s] = column[hotter] + (x - LOG_T[hotter]) * slopes[hotter];
  }
}

/**
 * out[s] = log10 of the s-th temperature in K, within FAST_LOG10_ERROR and
 * fastest inside the table's range, for s < n: for ranking Monte Carlo draws.
 */
export function fastLog10Temperatures(temperatureK: Float64Array, n: number, out: Float64Array): void {
  fastLog10Each(TEMPERATURE_GRID, temperatureK, 1, n, out);
}
