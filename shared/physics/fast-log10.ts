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

/** Centres of equal cells of a range of arguments, with their reciprocals and logarithms. */
export interface Log10Grid {
  readonly min: number;
  readonly inverseStep: number;
  readonly cells: number;
  readonly centre: Float64Array;
  readonly inverseCentre: Float64Array;
  readonly log10Centre: Float64Array;
}

const INVERSE_LN10 = 1 / Math.LN10;

/**
 * A grid over [min, max] with cells of width `step`, which must not exceed
 * min / 128: then |v / centre − 1| ≤ 1/256 inside the grid.
 */
export function log10Grid(min: number, max: number, step: number): Log10Grid {
  if (!(min > 0 && max > min && step > 0 && step <= min / 128)) throw new RangeError('log10Grid needs 0 < min < max and a step of at most min / 128');
  const cells = Math.ceil((max - min) / step) + 1;
  const centre = new Float64Array(cells);
  const inverseCentre = new Float64Array(cells);
  const log10Centre = new Float64Array(cells);
  for (let i = 0; i < cells; i++) {
    centre[i] = min + (i + 0.5) * step;
    inverseCentre[i] = 1 / centre[i];
    log10Centre[i] = Math.log10(centre[i]);
  }
  return { min, inverseStep: 1 / step, cells, centre, inverseCentre, log10Centre };
}

/** The cell of v in the grid; NaN or a number outside [0, cells) when v lies outside it. */
export function log10GridCell(grid: Log10Grid, v: number): number {
  return Math.floor((v - grid.min) * grid.inverseStep);
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
  const d = (v - grid.centre[cell]) * grid.inverseCentre[cell];
  const ln1p = d * (1 + d * (-1 / 2 + d * (1 / 3 + d * (-1 / 4 + d * (1 / 5 - d / 6)))));
  return grid.log10Centre[cell] + ln1p * INVERSE_LN10;
}

/** log10(v) from the grid, or from Math.log10 outside it; within FAST_LOG10_ERROR. */
export function fastLog10(grid: Log10Grid, v: number): number {
  const cell = log10GridCell(grid, v);
  return cell >= 0 && cell < grid.cells ? log10InCell(grid, v, cell) : Math.log10(v);
}
