/**
 * A fast base-10 logarithm with a known error bound, for ranking Monte Carlo
 * draws: Math.log10 costs several times everything else a draw does, and a
 * rank only has to be right to within a stated error (see
 * DrawModel.rankError). Never used for a value that is reported.
 */

/**
 * Bound on |logarithm − log10(v)|, in dex, for fastLog10 on any grid whose
 * logarithms stay below 300 in size, inside the grid or outside it (where
 * Math.log10 answers, to within an ulp of 324). See fastLog10.
 */
export const FAST_LOG10_ERROR = 2e-13;

/**
 * Equal cells over a range of arguments; per cell, side by side (one array,
 * so that a lookup touches one cache line): its centre, the centre's
 * reciprocal and the centre's logarithm.
 */
export interface Log10Grid {
  readonly min: number;
  readonly max: number;
  readonly inverseStep: number;
  readonly cells: number;
  readonly table: Float64Array;
}

const INVERSE_LN10 = 1 / Math.LN10;

/**
 * A grid over [min, max] with cells of width `step`, which must not exceed
 * min / 128: then |v / centre − 1| ≤ 1/256 inside the grid.
 */
export function log10Grid(min: number, max: number, step: number): Log10Grid {
  if (!(min > 0 && max > min && step > 0 && step <= min / 128)) throw new RangeError('log10Grid needs 0 < min < max and a step of at most min / 128');
  const cells = Math.ceil((max - min) / step) + 1;
  const table = new Float64Array(3 * cells);
  for (let i = 0; i < cells; i++) {
    const centre = min + (i + 0.5) * step;
    table[3 * i] = centre;
    table[3 * i + 1] = 1 / centre;
    table[3 * i + 2] = Math.log10(centre);
  }
  return { min, max, inverseStep: 1 / step, cells, table };
}

/** The cell of v in the grid, or −1 when v lies outside [min, max] (or is NaN). */
export function log10GridCell(grid: Log10Grid, v: number): number {
  return v >= grid.min && v <= grid.max ? ((v - grid.min) * grid.inverseStep) | 0 : -1;
}

/**
 * log10(v) for v in the given cell of the grid: log10 v = log10 c +
 * ln(1 + d) / ln 10 with c the cell's centre and d = (v − c) / c, |d| ≤ 1/256,
 * ln(1 + d) by its series to d⁶ (truncation below |d|⁷/7 < 10⁻¹⁷). v − c is
 * exact (Sterbenz: c ≥ 128 steps > 2 |v − c|); the rest rounds to within an
 * ulp or two of the result, 10⁻¹³ at most for results below 300.
 * @see P. T. P. Tang (1990), Table-driven implementation of the logarithm function in IEEE floating-point arithmetic, ACM TOMS 16, 378 (from memory)
 */
export function log10InCell(grid: Log10Grid, v: number, cell: number): number {
  const table = grid.table;
  const at = 3 * cell;
  const d = (v - table[at]) * table[at + 1];
  const ln1p = d * (1 + d * (-1 / 2 + d * (1 / 3 + d * (-1 / 4 + d * (1 / 5 - d / 6)))));
  return table[at + 2] + ln1p * INVERSE_LN10;
}

/** log10(v) from the grid, or from Math.log10 outside it; within FAST_LOG10_ERROR. */
export function fastLog10(grid: Log10Grid, v: number): number {
  const cell = log10GridCell(grid, v);
  return cell >= 0 ? log10InCell(grid, v, cell) : Math.log10(v);
}

/**
 * out[s] = fastLog10(grid, scale × values[s]) for s < n: the loop over a
 * Monte Carlo's draws lives here, beside the logarithm, because a loader
 * that turns modules into CommonJS (tsx does, for scripts) makes every use
 * of an imported name a getter call, too slow for once per draw.
 */
export function fastLog10Each(grid: Log10Grid, values: Float64Array, scale: number, n: number, out: Float64Array): void {
  for (let s = 0; s < n; s++) out[s] = fastLog10(grid, scale * values[s]);
}
