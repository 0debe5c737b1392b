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

/**
 * Draws per propagation. Kept at 1000 when the engine was made faster: the
 * half-width read from n draws scatters by about 0.96/√n of itself (3 % at
 * 1000), so 500 draws of the same stream would move a σ by some 3 % from the
 * 1000-draw value, more than the 2 % a cheaper default may cost. The speed
 * came from how the draws are computed, and the numbers did not change.
 */
export const DEFAULT_MONTE_CARLO_SAMPLES = 1000;

/** The smallest number of accepted draws from which a 68% interval is reported. */
const MIN_ACCEPTED = 50;

/**
 * Where the upper part of the last partition starts. partition returns two
 * indices; the second travels here so that the selection loop, run for
 * every propagation, allocates nothing.
 */
let upperStart = 0;

/**
 * One partition step of Hoare's selection on keys[lo..hi], moving draws[]
 * along with keys[]. The pivot is the median of the first, middle and last
 * entries, which splits nearer the middle than any one of them: a quarter
 * fewer steps on a thousand draws. Afterwards nothing in keys[lo..j] is
 * larger than the pivot, nothing in keys[upperStart..hi] is smaller, and the
 * entries strictly between j and upperStart equal the pivot and are in
 * place. Returns j.
 * @see C. A. R. Hoare (1961), Algorithm 65: FIND, Comm. ACM 4, 321
 * @see R. C. Singleton (1969), Algorithm 347, Comm. ACM 12, 185 (median of three; from memory)
 */
function partition(keys: Float64Array, draws: Float64Array, lo: number, hi: number): number {
  const first = keys[lo];
  const middle = keys[(lo + hi) >> 1];
  const last = keys[hi];
  const pivot =
    first < middle ? (middle < last ? middle : first < last ? last : first) : first < last ? first : middle < last ? last : middle;
  let i = lo;
  let j = hi;
  while (i <= j) {
    while (keys[i] < pivot) i++;
    while (keys[j] > pivot) j--;
    if (i <= j) {
      const key = keys[i];
      keys[i] = keys[j];
      keys[j] = key;
      const draw = draws[i];
      draws[i] = draws[j];
      draws[j] = draw;
      i++;
      j--;
    }
  }
  upperStart = i;
  return j;
}

/**
 * Rearranges keys[lo..hi] so that keys[k] holds the value it would have if
 * sorted, with nothing larger before it and nothing smaller after it, and
 * moves draws[] along with keys[] (Hoare's selection; linear time on
 * average, where a full sort is n log n).
 */
function select(keys: Float64Array, draws: Float64Array, k: number, lo: number, hi: number): void {
  while (hi > lo) {
    const j = partition(keys, draws, lo, hi);
    const i = upperStart;
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/**
 * The draws of one propagation, for a DrawModel to rank in one loop: each
 * input made on the fly from its nominal value, σ and the stream's deviates
 * (draw s takes the next deviate for each varying input, in input order, as
 * one generator call after another would hand them out), and the draws with
 * a finite rank kept beside the draw each came from.
 */
export class Draws {
  /** Draws kept so far: keys[0..accepted) and, position by position, their draws. */
  accepted = 0;

  constructor(
    /** How many draws there are. */
    readonly count: number,
    private readonly nominal: Float64Array,
    private readonly sigma: Float64Array,
    /** Per input, the index of its deviate within a draw's share; unused when σ = 0. */
    private readonly offset: Int32Array,
    private readonly deviates: Float64Array,
    /** Deviates each draw takes: one per input with σ ≠ 0. */
    private readonly varying: number,
    readonly keys: Float64Array,
    /** Draw indices as doubles: swapped beside the keys, one element type keeps the selection's loop tight. */
    readonly draws: Float64Array,
  ) {}

  /** Input i of draw s, exactly as f receives it. */
  input(i: number, s: number): number {
    const sigma = this.sigma[i];
    return sigma === 0 ? this.nominal[i] : this.nominal[i] + sigma * this.deviates[s * this.varying + this.offset[i]];
  }

  /** Writes every input of draw s into x. */
  inputsOf(s: number, x: Float64Array): void {
    for (let i = 0; i < x.length; i++) x[i] = this.input(i, s);
  }

  /** Keeps draw s with its rank; a rank that is not finite (NaN) rejects the draw. */
  keep(s: number, rank: number): void {
    if (Number.isFinite(rank)) {
      this.keys[this.accepted] = rank;
      this.draws[this.accepted++] = s;
    }
  }
}

/**
 * A faster way to run a law's draws than calling its checked function once
 * per draw. With a thousand draws per quantity, the checks, the thrown
 * errors, the call per draw and the last logarithm or power of ten are the
 * bulk of the cost, while the interval needs the values of four draws only:
 * the draws are ranked in one loop, and f's value is computed for the few
 * draws the interval is read from.
 */
export interface DrawModel {
  /**
   * Ranks every draw s < draws.count with draws.keep(s, rank): a number that
   * orders the draws as f's values do (never decreasing as f grows), NaN
   * exactly where f would throw or not be finite. Write it as Number.NaN in
   * such loops: in Node 20's V8 the global NaN in one branch makes every
   * result a number allocated on the heap, 16 bytes a draw for the
   * collector to sweep.
   */
  readonly rank: (draws: Draws) => void;
  /**
   * How far a rank may lie from the exactly computed one, in the rank's
   * unit. 0 means the ranks are exact, and equal ranks mean equal values.
   * Draws whose ranks lie this close to an order statistic's are settled
   * by their values.
   */
  readonly rankError: number;
  /** f without its checks at one draw's inputs; omit it when the rank is f's value itself. */
  readonly value?: (x: Float64Array) => number;
}

/**
 * Scratch shared by the propagations, grown on demand: the accepted ranks
 * with the draw each came from, and the inputs' nominal values, σ and
 * deviate offsets. One propagation runs at a time: no law calls a Monte
 * Carlo from inside another. Reuse spares the collector, which otherwise
 * sweeps a few kilobytes of small arrays per target.
 */
let keyScratch = new Float64Array(DEFAULT_MONTE_CARLO_SAMPLES);
let drawScratch = new Float64Array(DEFAULT_MONTE_CARLO_SAMPLES);
let nominalScratch = new Float64Array(4);
let sigmaScratch = new Float64Array(4);
let offsetScratch = new Int32Array(4);

/**
 * An order statistic of the accepted draws, by its rank (`key`), its draw,
 * and the nearest ranks on either side (±Infinity for none).
 */
interface OrderStatistic {
  readonly position: number;
  readonly key: number;
  readonly draw: number;
  readonly below: number;
  readonly above: number;
}

/**
 * select for two positions kLow < kHigh at once: both keys in place, with
 * nothing larger before kLow, nothing smaller after kHigh and everything
 * between them in between. Partitions serve both until a pivot falls
 * between them; then each side is selected alone, on about half the entries.
 */
function selectBoth(keys: Float64Array, draws: Float64Array, kLow: number, kHigh: number, lo: number, hi: number): void {
  while (hi > lo) {
    const j = partition(keys, draws, lo, hi);
    const i = upperStart;
    if (kHigh <= j) hi = j;
    else if (kLow >= i) lo = i;
    else {
      if (kLow <= j) select(keys, draws, kLow, lo, j);
      if (kHigh >= i) select(keys, draws, kHigh, i, hi);
      return;
    }
  }
}

/**
 * The four order statistics the central 68.27% interval is read from: the
 * 15.87th and 84.13th percentile positions of the n accepted draws and the
 * next ones up, with their neighbours (keys and draws are rearranged). Both
 * positions are selected together; scans of the three parts around them
 * then find each one's neighbours. Order statistics are unique, so the keys
 * are those of a full sort.
 */
function orderStatistics(keys: Float64Array, draws: Float64Array, n: number): OrderStatistic[] {
  const kLow = Math.floor(0.158655 * (n - 1));
  const kHigh = Math.floor(0.841345 * (n - 1));
  selectBoth(keys, draws, kLow, kHigh, 0, n - 1);
  const low = keys[kLow];
  const high = keys[kHigh];
  // Before kLow: the largest.
  let belowLow = -Infinity;
  for (let i = 0; i < kLow; i++) if (keys[i] > belowLow) belowLow = keys[i];
  // Between kLow and kHigh: the two smallest and the largest.
  let middle1 = Infinity;
  let middle1At = -1;
  let middle2 = Infinity;
  let belowHigh = low;
  for (let i = kLow + 1; i < kHigh; i++) {
    const key = keys[i];
    if (key < middle2) {
      if (key < middle1) {
        middle2 = middle1;
        middle1 = key;
        middle1At = i;
      } else middle2 = key;
    }
    if (key > belowHigh) belowHigh = key;
  }
  // Past kHigh: the two smallest.
  let above1 = Infinity;
  let above1At = -1;
  let above2 = Infinity;
  for (let i = kHigh + 1; i < n; i++) {
    const key = keys[i];
    if (key < above2) {
      if (key < above1) {
        above2 = above1;
        above1 = key;
        above1At = i;
      } else above2 = key;
    }
  }
  // kLow's neighbour above is the smallest past it, kHigh's own key when nothing lies between.
  const lowNext =
    middle1At >= 0
      ? { position: kLow + 1, key: middle1, draw: draws[middle1At], below: low, above: Math.min(middle2, high) }
      : { position: kLow + 1, key: high, draw: draws[kHigh], below: low, above: above1 };
  return [
    { position: kLow, key: low, draw: draws[kLow], below: belowLow, above: lowNext.key },
    lowNext,
    { position: kHigh, key: high, draw: draws[kHigh], below: belowHigh, above: above1 },
    above1At >= 0
      ? { position: kHigh + 1, key: above1, draw: draws[above1At], below: high, above: above2 }
      : { position: kHigh, key: high, draw: draws[kHigh], below: belowHigh, above: Infinity },
  ];
}

/**
 * The value of an order statistic whose key is approximate: its neighbours
 * tell whether any other draw is within reach. Ranks may be off by up to ε
 * = rankError, so the exact j-th smallest rank lies within ε of the j-th
 * smallest approximate one (an order statistic moves no further than its
 * elements), and its draw has an approximate rank within 2ε. With no other
 * rank within 3ε, the draw at that position is the one; else every draw
 * within 3ε is valued, the ones further off being on their side by more
 * than ε, far beyond any rounding of f, and the answer is the one preceded
 * by j minus the draws below the window.
 */
function valueOfOrderStatistic(statistic: OrderStatistic, draws: Draws, rankError: number, valueOfDraw: (x: Float64Array) => number, x: Float64Array): number {
  const window = 3 * rankError;
  if (rankError === 0 || (statistic.key - statistic.below > window && statistic.above - statistic.key > window)) {
    draws.inputsOf(statistic.draw, x);
    return valueOfDraw(x);
  }
  let below = 0;
  const candidates: number[] = [];
  for (let p = 0; p < draws.accepted; p++) {
    const key = draws.keys[p];
    if (key < statistic.key - window) below++;
    else if (key <= statistic.key + window) {
      draws.inputsOf(draws.draws[p], x);
      candidates.push(valueOfDraw(x));
    }
  }
  candidates.sort((a, b) => a - b);
  return candidates[statistic.position - below];
}

/**
 * Seeded Monte Carlo propagation of independent Gaussian inputs through f
 * (any units; f receives the inputs in the order given, in a buffer it must
 * not keep). Inputs with σ = 0 stay fixed. Draws where f throws or is not
 * finite are counted as rejected, never clipped. Throws PhysicsError when f
 * fails at the nominal inputs or fewer than 50 draws are accepted.
 *
 * With a `model`, f runs once, at the nominal inputs, where a refusal
 * carries its own message, and the model computes the draws (see
 * DrawModel); the interval is the same to the last digit.
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
  if (nominalScratch.length < k) {
    nominalScratch = new Float64Array(k);
    sigmaScratch = new Float64Array(k);
    offsetScratch = new Int32Array(k);
  }
  const nominal = nominalScratch;
  const sigma = sigmaScratch;
  const offset = offsetScratch;
  let varying = 0;
  for (let i = 0; i < k; i++) {
    nominal[i] = inputs[i].value;
    sigma[i] = inputs[i].sigma;
    if (sigma[i] !== 0) offset[i] = varying++;
  }
  // f's buffer holds exactly the inputs: f may read its length.
  const x = nominal.slice(0, k);
  const value = requireFiniteResult(f(x), quantity);

  if (keyScratch.length < samples) {
    keyScratch = new Float64Array(samples);
    drawScratch = new Float64Array(samples);
  }
  const draws = new Draws(samples, nominal, sigma, offset, standardNormals(options.seed ?? 1, samples * varying), varying, keyScratch, drawScratch);
  if (model) {
    model.rank(draws);
  } else {
    for (let s = 0; s < samples; s++) {
      draws.inputsOf(s, x);
      let y: number;
      try {
        y = f(x);
      } catch (error) {
        if (error instanceof PhysicsError) continue;
        throw error;
      }
      draws.keep(s, y);
    }
  }
  const accepted = draws.accepted;
  if (accepted < MIN_ACCEPTED) {
    throw new PhysicsError(
      'out_of_range',
      quantity,
      `${quantity}: only ${accepted} of ${samples} Monte Carlo draws fall inside the model's domain; the inputs' uncertainties reach beyond it`,
      `${MIN_ACCEPTED} valid draws`,
    );
  }
  const [lowStatistic, lowNext, highStatistic, highNext] = orderStatistics(draws.keys, draws.draws, accepted);
  const valueOfDraw = model?.value;
  const rankError = model?.rankError ?? 0;
  const valueOf = (statistic: OrderStatistic): number => (valueOfDraw ? valueOfOrderStatistic(statistic, draws, rankError, valueOfDraw, x) : statistic.key);
  // Each end is linear between neighbouring order statistics.
  const lowPosition = 0.158655 * (accepted - 1);
  const highPosition = 0.841345 * (accepted - 1);
  const lowBelow = valueOf(lowStatistic);
  const highBelow = valueOf(highStatistic);
  const low = lowBelow + (valueOf(lowNext) - lowBelow) * (lowPosition - lowStatistic.position);
  const high = highBelow + (valueOf(highNext) - highBelow) * (highPosition - highStatistic.position);
  return { value, sigma: (high - low) / 2, low, high, accepted, rejected: samples - accepted };
}

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
  selectInPlace(scratch, kHigh, 0, n - 1);
  selectInPlace(scratch, kLow, 0, kHigh - 1);
  const lowBelow = scratch[kLow];
  const lowAbove = smallest(scratch, kLow + 1, kHigh + 1);
  const highBelow = scratch[kHigh];
  const highAbove = kHigh + 1 < n ? smallest(scratch, kHigh + 1, n) : highBelow;
  return {
    low: lowBelow + (lowAbove - lowBelow) * (lowPosition - kLow),
    high: highBelow + (highAbove - highBelow) * (highPosition - kHigh),
    accepted: n,
    rejected: draws.length - n,
  };
}
