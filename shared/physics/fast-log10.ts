/**
 * A fast base-10 logarithm with a known error bound, for ranking Monte Carlo
 * draws: Math.log10 costs more than the rest of such a draw, and a rank only
 * has to be right to within a stated error (see DrawModel.rankError). Never
 * used for a value that is reported.
 */

/**
 * Bound on |Log10Grid.log10(v) − log10(v)|, in dex, for any v: some 10⁻¹⁵
 * inside a grid of arguments below 10^300, an ulp of results up to 324
 * outside it, where Math.log10 answers; the bound is generous to both.
 */
export const FAST_LOG10_ERROR = 2e-13;

const INVERSE_LN10 = 1 / Math.LN10;
const ONE_THIRD = 1 / 3;
const ONE_FIFTH = 1 / 5;

/**
 * Equal cells over a range of arguments, with, per cell and side by side
 * (one array, so that a lookup touches one cache line): the centre, its
 * reciprocal and its logarithm. Methods rather than imported functions: a
 * loader that turns modules into CommonJS (tsx does, for scripts) makes
 * every use of an imported name a getter call, too slow for once per draw.
 */
export class Log10Grid {
  private readonly min: number;
  private readonly max: number;
  private readonly inverseStep: number;
  private readonly table: Float64Array;

  /** A grid over [min, max] with cells of width `step`, at most min / 128: then |v / centre − 1| ≤ 1/256. */
  constructor(min: number, max: number, step: number) {
    if (!(min > 0 && max > min && step > 0 && step <= min / 128)) throw new RangeError('Log10Grid needs 0 < min < max and a step of at most min / 128');
    const cells = Math.ceil((max - min) / step) + 1;
    this.min = min;
    this.max = max;
    this.inverseStep = 1 / step;
    this.table = new Float64Array(3 * cells);
    for (let i = 0; i < cells; i++) {
      const centre = min + (i + 0.5) * step;
      this.table[3 * i] = centre;
      this.table[3 * i + 1] = 1 / centre;
      this.table[3 * i + 2] = Math.log10(centre);
    }
  }

  /**
   * log10(v), within FAST_LOG10_ERROR. Inside the grid: log10 v = log10 c +
   * ln(1 + d) / ln 10 with c the centre of v's cell and d = (v − c) / c,
   * |d| ≤ 1/256, ln(1 + d) by its series to d⁵ (truncation below |d|⁶/6 <
   * 10⁻¹⁵), written with products only, as a quotient costs several; v − c
   * is exact (Sterbenz: c ≥ 128 steps > 2 |v − c|) and the rest rounds to
   * within an ulp or two of the result. Outside it (or NaN): Math.log10.
   * @see P. T. P. Tang (1990), Table-driven implementation of the logarithm function in IEEE floating-point arithmetic, ACM TOMS 16, 378 (from memory)
   */
  log10(v: number): number {
    if (!(v >= this.min && v <= this.max)) return Math.log10(v);
    const at = 3 * (((v - this.min) * this.inverseStep) | 0);
    const table = this.table;
    const d = (v - table[at]) * table[at + 1];
    const ln1p = d * (1 + d * (-0.5 + d * (ONE_THIRD + d * (-0.25 + d * ONE_FIFTH))));
    return table[at + 2] + ln1p * INVERSE_LN10;
  }
}
