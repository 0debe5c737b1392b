import { PhysicsError, requireFiniteResult } from './errors';
import type { Measured } from './measured';
import { standardNormals } from './random';

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

export const DEFAULT_MONTE_CARLO_SAMPLES = 1000;

/** The smallest number of accepted draws from which a 68% interval is reported. */
const MIN_ACCEPTED = 50;

/**
 * Rearranges a[lo..hi] so that a[k] holds the value it would have if sorted,
 * with nothing larger before it and nothing smaller after it (Hoare's
 * selection; linear time on average, where a full sort is n log n).
 * @see C. A. R. Hoare (1961), Algorithm 65: FIND, Comm. ACM 4, 321
 */
function select(a: Float64Array, k: number, lo: number, hi: number): void {
  while (hi > lo) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/** Where a draw's inputs come from: the nominal values, their σ and the stream's deviates. */
interface DrawSource {
  readonly nominal: Float64Array;
  readonly sigma: Float64Array;
  readonly deviates: Float64Array;
  /** Deviates each draw takes: one per input with σ ≠ 0, in input order. */
  readonly varying: number;
}

/** Writes the inputs of draw s into x, exactly as the draw loop made them. */
function inputsOfDraw(source: DrawSource, s: number, x: Float64Array): void {
  let next = s * source.varying;
  for (let i = 0; i < x.length; i++) {
    x[i] = source.sigma[i] === 0 ? source.nominal[i] : source.nominal[i] + source.sigma[i] * source.deviates[next++];
  }
}

/**
 * Quantile p of the draws, linear between neighbouring order statistics:
 * keys[kLo..kHi] must hold the order statistics k..kHi after select(keys, k),
 * where k = floor(p (n − 1)); the partner of a[k] is the smallest key of
 * (k..kHi]. `outcome` turns the position of a key into the draw's value.
 */
function interpolatedQuantile(keys: Float64Array, k: number, kHi: number, fraction: number, outcome: (position: number) => number): number {
  const below = outcome(k);
  if (k + 1 > kHi) return below;
  let at = k + 1;
  for (let i = k + 2; i <= kHi; i++) if (keys[i] < keys[at]) at = i;
  const above = outcome(at);
  return below + (above - below) * fraction;
}

/**
 * The 15.87th and 84.13th percentiles of the n accepted draws (keys is
 * rearranged). The upper order statistic is selected first; the lower one is
 * then selected among the entries below it only, and its interpolation
 * partner looked for there too, since nothing past the upper one is smaller.
 * Order statistics are unique, so this gives the numbers a full sort gives.
 */
function centralInterval(keys: Float64Array, n: number, outcome: (position: number) => number): { low: number; high: number } {
  const posHigh = 0.841345 * (n - 1);
  const kHigh = Math.floor(posHigh);
  select(keys, kHigh, 0, n - 1);
  const high = interpolatedQuantile(keys, kHigh, n - 1, posHigh - kHigh, outcome);
  const posLow = 0.158655 * (n - 1);
  const kLow = Math.floor(posLow);
  select(keys, kLow, 0, kHigh);
  const low = interpolatedQuantile(keys, kLow, kHigh, posLow - kLow, outcome);
  return { low, high };
}

/**
 * A faster way to run a model's draws than calling its checked function.
 * Thousands of draws per quantity make the checks, the thrown errors and
 * the last power of ten the bulk of the cost, while the interval needs the
 * values of four draws only.
 */
export interface DrawModel {
  /** f without its checks: the same arithmetic, NaN where f would throw. Never throws. */
  readonly exact: (x: Float64Array) => number;
  /**
   * A cheaper number that orders the draws as `exact` does (never
   * decreasing as it grows), and is NaN exactly where `exact` is not a
   * finite number. When given, `exact` runs only for the draws the interval
   * is read from. Omit it when `exact` is as cheap.
   */
  readonly rank?: (x: Float64Array) => number;
}

/** Scratch for the accepted draws' keys and for the rank of each draw, grown on demand. */
let keyBuffer = new Float64Array(DEFAULT_MONTE_CARLO_SAMPLES);
let rankBuffer = new Float64Array(DEFAULT_MONTE_CARLO_SAMPLES);

/**
 * Seeded Monte Carlo propagation of independent Gaussian inputs through f
 * (any units; f receives the inputs in the order given, in a buffer it must
 * not keep). Inputs with σ = 0 stay fixed. Draws where f throws or is not
 * finite are counted as rejected, never clipped. Throws PhysicsError when f
 * fails at the nominal inputs or fewer than 50 draws are accepted.
 *
 * With a `model`, f runs once, at the nominal inputs, where a refusal
 * carries its own message, and the model computes the draws; the result is
 * the same to the last digit. Neither f nor the model may itself run a
 * Monte Carlo (the draws live in shared scratch buffers).
 * @see JCGM 101:2008 (GUM Supplement 1), propagation of distributions by Monte Carlo
 */
export function monteCarlo(
  f: (x: Float64Array) => number,
  inputs: readonly Measured[],
  quantity: string,
  options: MonteCarloOptions = {},
  model?: DrawModel,
): MonteCarloResult {
  const samples = Math.max(MIN_ACCEPTED, Math.floor(options.samples ?? DEFAULT_MONTE_CARLO_SAMPLES));
  const k = inputs.length;
  const nominal = new Float64Array(k);
  const sigma = new Float64Array(k);
  let varying = 0;
  for (let i = 0; i < k; i++) {
    nominal[i] = inputs[i].value;
    sigma[i] = inputs[i].sigma;
    if (sigma[i] !== 0) varying++;
  }
  const x = nominal.slice();
  const value = requireFiniteResult(f(x), quantity);

  // Draw s takes the next deviate of the stream for each varying input in
  // order, as one generator call after another would hand them out.
  const source: DrawSource = { nominal, sigma, deviates: standardNormals(options.seed ?? 1, samples * varying), varying };
  if (keyBuffer.length < samples) {
    keyBuffer = new Float64Array(samples);
    rankBuffer = new Float64Array(samples);
  }
  const keys = keyBuffer;
  const rankOfDraw = rankBuffer;
  const rank = model?.rank;
  const evaluate = model ? model.exact : f;
  let accepted = 0;
  for (let s = 0; s < samples; s++) {
    inputsOfDraw(source, s, x);
    let y: number;
    if (rank) {
      y = rank(x);
      rankOfDraw[s] = y;
    } else {
      try {
        y = evaluate(x);
      } catch (error) {
        if (error instanceof PhysicsError) continue;
        throw error;
      }
    }
    if (Number.isFinite(y)) keys[accepted++] = y;
  }
  if (accepted < MIN_ACCEPTED) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity}: only ${accepted} of ${samples} Monte Carlo draws fall inside the model's domain; the inputs' uncertainties reach beyond it`,
      `${MIN_ACCEPTED} valid draws`,
    );
  }
  // Ranked draws: find the draw that holds a key and compute its value.
  const outcome = rank
    ? (position: number): number => {
        const key = keys[position];
        let s = 0;
        while (rankOfDraw[s] !== key) s++;
        inputsOfDraw(source, s, x);
        return evaluate(x);
      }
    : (position: number): number => keys[position];
  const { low, high } = centralInterval(keys, accepted, outcome);
  return { value, sigma: (high - low) / 2, low, high, accepted, rejected: samples - accepted };
}
