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

/**
 * Cells of 16 K over the table's range, for finding a temperature's rows
 * without a search. 16 K is finer than the closest pair of rows (20 K
 * apart), so a cell holds at most one.
 */
const CELL_K = 16;

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
