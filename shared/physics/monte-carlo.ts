import { PhysicsError, requireFiniteResult } from './errors';
import type { Measured } from './measured';
import { fillStandardNormals } from './random';

/** Options of a Monte Carlo propagation. */
export interface MonteCarloOptions {
  /** Number of draws (default 1000; the 68% half-width is then known to about 3%). */
  samples?: number;
  /** Seed of the draws (default 1). */
  seed?: number;
}

/** Result of a Monte Carlo propagation. */
export interface MonteCarloResult {
  /** f at the nominal inputs: reproducible to the last digit, and equal to the first-order value. */
  readonly value: number;
  /** Half the central 68.27% interval of the accepted draws. */
  readonly sigma: number;
  /** 15.87th and 84.13th percentiles of the draws; the interval is asymmetric when f is. */
  readonly low: number;
  readonly high: number;
  readonly accepted: number;
  /** Draws for which f threw or returned a non-finite number (e.g. across a singularity). */
  readonly rejected: number;
}

/**
 * Draws per propagation: the half-width read from n draws scatters by about
 * 0.96/√n of itself, 3 % at 1000.
 */
export const DEFAULT_MONTE_CARLO_SAMPLES = 1000;

/** The smallest number of accepted draws from which a 68% interval is reported. */
const MIN_ACCEPTED = 50;

/** Cumulative probability of the lower and upper end of the central 68.27 % interval: Φ(∓1). */
const LOW_PROBABILITY = 0.158655;
const HIGH_PROBABILITY = 0.841345;

/** The central 68.27 % interval of a set of Monte Carlo draws. */
export interface DrawSummary {
  /** 15.87th and 84.13th percentiles of the finite draws. */
  readonly low: number;
  readonly high: number;
  /** Draws that are finite numbers; the rest (NaN, where a law refused the draw) are left out and counted. */
  readonly accepted: number;
  readonly rejected: number;
}

/**
 * Moves the k-th smallest of a[lo..hi] to a[k], nothing larger before it and
 * nothing smaller after it: Floyd and Rivest's SELECT, which first selects
 * within a small sample around where k must fall (so that the pivot is
 * already near the k-th value) and then partitions once; about 1.5 n
 * comparisons where Hoare's selection takes some 3 n.
 * @see R. W. Floyd & R. L. Rivest (1975), Algorithm 489: The algorithm SELECT, Comm. ACM 18, 173
 */
function selectInPlace(a: Float64Array, k: number, lo: number, hi: number): void {
  let left = lo;
  let right = hi;
  while (right > left) {
    if (right - left > 600) {
      const n = right - left + 1;
      const i = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (i < n / 2 ? -1 : 1);
      selectInPlace(a, k, Math.max(left, Math.floor(k - (i * s) / n + sd)), Math.min(right, Math.floor(k + ((n - i) * s) / n + sd)));
    }
    const t = a[k];
    let i = left;
    let j = right;
    let x = a[left];
    a[left] = a[k];
    a[k] = x;
    if (a[right] > t) {
      x = a[left];
      a[left] = a[right];
      a[right] = x;
    }
    while (i < j) {
      x = a[i];
      a[i] = a[j];
      a[j] = x;
      i++;
      j--;
      while (a[i] < t) i++;
      while (a[j] > t) j--;
    }
    if (a[left] === t) {
      x = a[left];
      a[left] = a[j];
      a[j] = x;
    } else {
      j++;
      x = a[j];
      a[j] = a[right];
      a[right] = x;
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

/** The smallest of a[from..to). */
function smallest(a: Float64Array, from: number, to: number): number {
  let min = a[from];
  for (let i = from + 1; i < to; i++) if (a[i] < min) min = a[i];
  return min;
}

/**
 * The central 68.27 % interval of `draws`, each end read at p (n − 1) of the
 * n finite draws, linearly between the neighbouring order statistics (the
 * "type 7" rule numpy.percentile uses by default). `scratch` (at least as
 * long as draws) is overwritten; the draws are not. Throws PhysicsError when
 * fewer than 50 draws are finite.
 * @see JCGM 101:2008 (GUM Supplement 1) §7.7, the probabilistically symmetric coverage interval; R. J. Hyndman & Y. Fan (1996), Am. Stat. 50, 361 (type 7)
 */
export function summariseDraws(draws: Float64Array, scratch: Float64Array, quantity: string): DrawSummary {
  let n = 0;
  for (let s = 0; s < draws.length; s++) {
    const x = draws[s];
    // x − x is 0 for a finite x and NaN for ±Infinity and NaN.
    if (x - x === 0) scratch[n++] = x;
  }
  if (n < MIN_ACCEPTED) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity}: only ${n} of ${draws.length} Monte Carlo draws fall inside the model's domain; the inputs' uncertainties reach beyond it`,
      `${MIN_ACCEPTED} valid draws`,
    );
  }
  const lowPosition = LOW_PROBABILITY * (n - 1);
  const highPosition = HIGH_PROBABILITY * (n - 1);
  const kLow = Math.floor(lowPosition);
  const kHigh = Math.floor(highPosition);
  const [lowBelow, lowAbove, highBelow, highAbove] = bySelection(scratch, n, kLow, kHigh);
  return {
    low: lowBelow + (lowAbove - lowBelow) * (lowPosition - kLow),
    high: highBelow + (highAbove - highBelow) * (highPosition - kHigh),
    accepted: n,
    rejected: draws.length - n,
  };
}

/** The values of ranks kLow, kLow + 1, kHigh, kHigh + 1 (the last clamped to n − 1) of a[0..n), by selection; a is rearranged. */
function bySelection(a: Float64Array, n: number, kLow: number, kHigh: number): number[] {
  selectInPlace(a, kHigh, 0, n - 1);
  selectInPlace(a, kLow, 0, kHigh - 1);
  return [a[kLow], smallest(a, kLow + 1, kHigh + 1), a[kHigh], kHigh + 1 < n ? smallest(a, kHigh + 1, n) : a[kHigh]];
}

/**
 * Seeded Monte Carlo propagation of independent Gaussian inputs through f
 * (any units; f receives the inputs in the order given, in a buffer it must
 * not keep). Draw s of input i is its value plus σᵢ times the (s k + i)-th
 * deviate of the seed's stream; inputs with σ = 0 stay fixed. Draws where f
 * throws a PhysicsError or is not finite are counted as rejected, never
 * clipped. Throws PhysicsError when f fails at the nominal inputs or fewer
 * than 50 draws are accepted. The derivation engine does not call this: it
 * draws the raw measurements once and pushes them through its whole graph
 * (see derive/evaluate.ts); this serves a single law on its own.
 * @see JCGM 101:2008 (GUM Supplement 1), propagation of distributions by Monte Carlo
 */
export function monteCarlo(f: (x: Float64Array) => number, inputs: readonly Measured[], quantity: string, options: MonteCarloOptions = {}): MonteCarloResult {
  const samples = Math.max(MIN_ACCEPTED, Math.floor(options.samples ?? DEFAULT_MONTE_CARLO_SAMPLES));
  const k = inputs.length;
  const x = Float64Array.from(inputs, (m) => m.value);
  const value = requireFiniteResult(f(x), quantity);
  const deviates = new Float64Array(samples * k);
  fillStandardNormals(options.seed ?? 1, deviates);
  const draws = new Float64Array(samples);
  for (let s = 0; s < samples; s++) {
    for (let i = 0; i < k; i++) x[i] = inputs[i].value + inputs[i].sigma * deviates[s * k + i];
    let y: number;
    try {
      y = f(x);
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      y = Number.NaN;
    }
    draws[s] = y;
  }
  const summary = summariseDraws(draws, new Float64Array(samples), quantity);
  return { value, sigma: (summary.high - summary.low) / 2, low: summary.low, high: summary.high, accepted: summary.accepted, rejected: summary.rejected };
}
