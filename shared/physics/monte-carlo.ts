import { PhysicsError, requireFiniteResult } from './errors';
import type { Measured } from './measured';
import { gaussian, mulberry32 } from './random';

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

/** Quantile p of a[0..n) with linear interpolation between order statistics (a is rearranged). */
function quantile(a: Float64Array, n: number, p: number): number {
  const pos = p * (n - 1);
  const k = Math.floor(pos);
  select(a, k, 0, n - 1);
  const below = a[k];
  if (k + 1 >= n) return below;
  let above = Infinity;
  for (let i = k + 1; i < n; i++) if (a[i] < above) above = a[i];
  return below + (above - below) * (pos - k);
}

/**
 * Seeded Monte Carlo propagation of independent Gaussian inputs through f
 * (any units; f receives the inputs in the order given, in a buffer it must
 * not keep). Inputs with σ = 0 stay fixed. Draws where f throws or is not
 * finite are counted as rejected, never clipped. Throws PhysicsError when f
 * fails at the nominal inputs or fewer than 50 draws are accepted.
 * @see JCGM 101:2008 (GUM Supplement 1), propagation of distributions by Monte Carlo
 */
export function monteCarlo(
  f: (x: Float64Array) => number,
  inputs: readonly Measured[],
  quantity: string,
  options: MonteCarloOptions = {},
): MonteCarloResult {
  const samples = Math.max(MIN_ACCEPTED, Math.floor(options.samples ?? DEFAULT_MONTE_CARLO_SAMPLES));
  const normal = gaussian(mulberry32(options.seed ?? 1));
  const k = inputs.length;
  const x = new Float64Array(k);
  for (let i = 0; i < k; i++) x[i] = inputs[i].value;
  const value = requireFiniteResult(f(x), quantity);

  const draws = new Float64Array(samples);
  let accepted = 0;
  for (let s = 0; s < samples; s++) {
    for (let i = 0; i < k; i++) {
      const m = inputs[i];
      x[i] = m.sigma === 0 ? m.value : m.value + m.sigma * normal();
    }
    let y: number;
    try {
      y = f(x);
    } catch (error) {
      if (error instanceof PhysicsError) continue;
      throw error;
    }
    if (Number.isFinite(y)) draws[accepted++] = y;
  }
  if (accepted < MIN_ACCEPTED) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity}: only ${accepted} of ${samples} Monte Carlo draws fall inside the model's domain; the inputs' uncertainties reach beyond it`,
      `${MIN_ACCEPTED} valid draws`,
    );
  }
  const low = quantile(draws, accepted, 0.158655);
  const high = quantile(draws, accepted, 0.841345);
  return { value, sigma: (high - low) / 2, low, high, accepted, rejected: samples - accepted };
}
