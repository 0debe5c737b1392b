import { CONSTANTS } from './constants';
import { PhysicsError, requireFinite, requirePositive, type PhysicsWarning } from './errors';
import type { Measured } from './measured';

const H = CONSTANTS.h.value;
const C = CONSTANTS.c.value;
const K_B = CONSTANTS.k_B.value;
const HC_OVER_K = (H * C) / K_B;

/**
 * Planck's law per unit wavelength, B_λ(T) = 2hc² / λ⁵ / (exp(hc / λk_BT) − 1),
 * in W m⁻² m⁻¹ sr⁻¹ for a wavelength in m and a temperature in K.
 * @see CODATA 2018 h, c, k_B; REFERENCES.md "Planck function"
 */
export function planckSpectralRadiance(wavelengthM: number, temperatureK: number): number {
  requirePositive(wavelengthM, 'wavelength');
  requirePositive(temperatureK, 'temperature');
  return planckUnchecked(wavelengthM, temperatureK);
}

function planckUnchecked(wavelengthM: number, temperatureK: number): number {
  const x = HC_OVER_K / (wavelengthM * temperatureK);
  const l5 = wavelengthM ** 5;
  return (2 * H * C * C) / l5 / Math.expm1(x);
}

/**
 * Wavelength in m of the maximum of B_λ for a temperature in K, solved from
 * dB_λ/dλ = 0 (x = 5 (1 − e⁻ˣ), x = hc / λk_BT) with h, c and k_B alone, so
 * that it checks Wien's b independently.
 * @see CODATA 2018 h, c, k_B
 */
export function planckPeakWavelengthM(temperatureK: number): number {
  requirePositive(temperatureK, 'temperature');
  let x = 5;
  for (let i = 0; i < 50; i++) {
    const g = x - 5 * (1 - Math.exp(-x));
    const dg = 1 - 5 * Math.exp(-x);
    const step = g / dg;
    x -= step;
    if (Math.abs(step) < 1e-15 * x) break;
  }
  return HC_OVER_K / (x * temperatureK);
}

/**
 * A 1-D spectrum: wavelengths in m, spectral flux density in any consistent
 * unit (W m⁻² m⁻¹ for a calibrated one), and optionally its 1-sigma
 * uncertainties in the same unit. Single noisy points may be negative.
 */
export interface Spectrum {
  readonly wavelengthM: readonly number[];
  readonly flux: readonly number[];
  readonly fluxSigma?: readonly number[];
}

/**
 * What the fit assumed about the noise on each point: the flux uncertainties
 * the spectrum gave, or a noise level estimated from the scatter about the fit
 * as it varies with the flux, σᵢ² = a² + (b·Fᵢ)², a the part the same at every
 * point and b the part proportional to the flux.
 */
export interface PlanckNoise {
  readonly model: 'given' | 'flux_level';
  /** For 'flux_level': a in the flux unit and b as a share of the flux. */
  readonly constant?: number;
  readonly proportional?: number;
  /** The assumption in words, for the method line. */
  readonly words: string;
}

/** A least-squares fit of flux = scale × B_λ(T). */
export interface PlanckFit {
  /** Temperature in K. */
  readonly temperatureK: Measured;
  /** Natural logarithm of the scale (flux unit per W m⁻² m⁻¹ sr⁻¹; for a star (R/d)² π). */
  readonly logScale: Measured;
  /** Correlation coefficient between T and log scale. */
  readonly correlation: number;
  /** χ² with the weights used: near the degrees of freedom when the noise model holds (by construction when it was estimated). */
  readonly chiSquare: number;
  readonly degreesOfFreedom: number;
  readonly reducedChiSquare: number;
  readonly iterations: number;
  readonly noise: PlanckNoise;
  readonly warnings: PhysicsWarning[];
}

function checkSpectrum(spectrum: Spectrum): void {
  const n = spectrum.wavelengthM.length;
  if (spectrum.flux.length !== n || (spectrum.fluxSigma && spectrum.fluxSigma.length !== n)) {
    throw new PhysicsError('missing_input', 'spectrum', 'spectrum columns differ in length');
  }
  for (let i = 0; i < n; i++) {
    requirePositive(spectrum.wavelengthM[i], `wavelength (point ${i + 1})`);
    requireFinite(spectrum.flux[i], `flux (point ${i + 1})`);
    if (spectrum.fluxSigma) requirePositive(spectrum.fluxSigma[i], `flux uncertainty (point ${i + 1})`);
  }
}

/** The points of a fit with their weights 1/σᵢ² (null: all 1). */
interface Weighted {
  readonly wavelengthM: readonly number[];
  readonly flux: readonly number[];
  readonly weight: Float64Array | null;
}

interface Accumulated {
  chi2: number;
  jtj: [number, number, number];
  jtr: [number, number];
}

/** χ² and normal equations for parameters (ln T, ln s); the model's partials are relative. */
function accumulate(points: Weighted, lnT: number, lnS: number): Accumulated {
  const t = Math.exp(lnT);
  const s = Math.exp(lnS);
  let chi2 = 0;
  let a = 0;
  let b = 0;
  let d = 0;
  let g0 = 0;
  let g1 = 0;
  const n = points.wavelengthM.length;
  for (let i = 0; i < n; i++) {
    const lambda = points.wavelengthM[i];
    const w = points.weight ? points.weight[i] : 1;
    const x = HC_OVER_K / (lambda * t);
    const model = s * planckUnchecked(lambda, t);
    // ∂model/∂lnT = model · x / (1 − e⁻ˣ); ∂model/∂lns = model
    const jT = model * (x / -Math.expm1(-x));
    const jS = model;
    const r = points.flux[i] - model;
    chi2 += w * r * r;
    a += w * jT * jT;
    b += w * jT * jS;
    d += w * jS * jS;
    g0 += w * jT * r;
    g1 += w * jS * r;
  }
  return { chi2, jtj: [a, b, d], jtr: [g0, g1] };
}

/** Best scale for a fixed temperature (linear least squares), or NaN when not positive. */
function bestLogScale(points: Weighted, temperatureK: number): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < points.wavelengthM.length; i++) {
    const w = points.weight ? points.weight[i] : 1;
    const model = planckUnchecked(points.wavelengthM[i], temperatureK);
    num += w * points.flux[i] * model;
    den += w * model * model;
  }
  return num > 0 && den > 0 ? Math.log(num / den) : Number.NaN;
}

/** Temperatures in K searched for the starting point of the fit. */
const GRID_MIN_K = 500;
const GRID_MAX_K = 200_000;
/** Most points the starting grid looks at. */
const GRID_POINTS = 1000;

/** Coarse grid in log T, the scale solved linearly at each: the start of the refinement. */
/** Every k-th point, k the smallest that leaves at most `most`; the points themselves when there are no more. */
function thinned(points: Weighted, most: number): Weighted {
  const stride = Math.ceil(points.wavelengthM.length / most);
  if (stride <= 1) return points;
  const keep = (_: unknown, i: number) => i % stride === 0;
  return { wavelengthM: points.wavelengthM.filter(keep), flux: points.flux.filter(keep), weight: points.weight ? points.weight.filter(keep) : null };
}

function startingPoint(points: Weighted): { lnT: number; lnS: number } {
  // The grid only picks where the refinement starts, so every k-th point serves it and its cost stays fixed however long the spectrum.
  const coarse = thinned(points, GRID_POINTS);
  let best = { lnT: Number.NaN, lnS: Number.NaN };
  let bestChi2 = Infinity;
  const steps = 160;
  for (let k = 0; k <= steps; k++) {
    const lnT = Math.log(GRID_MIN_K) + (k / steps) * Math.log(GRID_MAX_K / GRID_MIN_K);
    const lnS = bestLogScale(coarse, Math.exp(lnT));
    if (!Number.isFinite(lnS)) continue;
    const { chi2 } = accumulate(coarse, lnT, lnS);
    if (chi2 < bestChi2) {
      bestChi2 = chi2;
      best = { lnT, lnS };
    }
  }
  return best;
}

/** Levenberg–Marquardt on (ln T, ln scale) from a start, with the given weights. */
function refine(points: Weighted, start: { lnT: number; lnS: number }): { lnT: number; lnS: number; at: Accumulated; iterations: number } {
  let { lnT, lnS } = start;
  let current = accumulate(points, lnT, lnS);
  let lambda = 1e-3;
  let iterations = 0;
  // A step that lowers χ² by less than a millionth of χ²/dof is the end: a change of χ²/dof in χ² moves a parameter
  // by its 1σ (Numerical Recipes §15.5: stop once χ² decreases by a negligible amount; from memory), so the last step was ~10⁻³σ.
  const negligible = (1e-6 * current.chi2) / Math.max(points.wavelengthM.length - 2, 1);
  for (; iterations < 200; iterations++) {
    const [a, b, d] = current.jtj;
    const [g0, g1] = current.jtr;
    const a1 = a * (1 + lambda);
    const d1 = d * (1 + lambda);
    const det = a1 * d1 - b * b;
    if (!(det > 0)) break;
    const dT = (d1 * g0 - b * g1) / det;
    const dS = (a1 * g1 - b * g0) / det;
    const trial = accumulate(points, lnT + dT, lnS + dS);
    if (Number.isFinite(trial.chi2) && trial.chi2 <= current.chi2) {
      const improvement = current.chi2 - trial.chi2;
      lnT += dT;
      lnS += dS;
      current = trial;
      lambda = Math.max(lambda / 10, 1e-12);
      if (improvement <= negligible) break;
    } else {
      lambda *= 10;
      if (lambda > 1e12) break;
    }
  }
  return { lnT, lnS, at: current, iterations };
}

/**
 * The noise level as it varies with the flux, from the scatter about a fit:
 * the squared residuals rᵢ² regressed on (1, Fᵢ²), whose expectation is
 * a² + b²Fᵢ² (Fᵢ the fitted flux, so a point's own noise does not set its
 * weight). Var(rᵢ²) = 2vᵢ² for Gaussian noise of variance vᵢ, so the
 * regression is weighted by 1/vᵢ² and repeated until v settles: the Gaussian
 * maximum-likelihood estimate, without which the bright points would set the
 * faint points' noise. A part that comes out negative is dropped and the
 * other refitted alone. Null when the residuals are all zero (a noise-free
 * spectrum).
 * @see R. J. Carroll & D. Ruppert, Transformation and Weighting in Regression (1988), ch. 3, variance function estimation by regression on squared residuals (from memory)
 */
function noiseFromScatter(points: Weighted, lnT: number, lnS: number): { a2: number; b2: number; model: Float64Array } | null {
  const n = points.wavelengthM.length;
  const t = Math.exp(lnT);
  const s = Math.exp(lnS);
  const model = new Float64Array(n);
  const m2 = new Float64Array(n);
  const e2 = new Float64Array(n);
  let top = 0;
  for (let i = 0; i < n; i++) {
    model[i] = s * planckUnchecked(points.wavelengthM[i], t);
    top = Math.max(top, Math.abs(model[i]));
  }
  if (!(top > 0)) return null;
  let meanE2 = 0;
  for (let i = 0; i < n; i++) {
    // The fitted flux scaled by its largest value keeps the 2 × 2 normal equations well conditioned.
    m2[i] = (model[i] / top) ** 2;
    e2[i] = (points.flux[i] - model[i]) ** 2;
    meanE2 += e2[i] / n;
  }
  if (!(meanE2 > 0)) return null;
  let a2 = meanE2;
  let b2 = 0;
  for (let pass = 0; pass < VARIANCE_PASSES; pass++) {
    let s0 = 0;
    let s2 = 0;
    let s4 = 0;
    let r0 = 0;
    let r2 = 0;
    for (let i = 0; i < n; i++) {
      // The first pass is unweighted; later ones weight by 1 / v², v from the pass before.
      const v = pass === 0 ? 1 : a2 + b2 * m2[i];
      const w = 1 / (v * v);
      s0 += w;
      s2 += w * m2[i];
      s4 += w * m2[i] * m2[i];
      r0 += w * e2[i];
      r2 += w * e2[i] * m2[i];
    }
    const det = s0 * s4 - s2 * s2;
    let nextA2 = det > 0 ? (s4 * r0 - s2 * r2) / det : Number.NaN;
    let nextB2 = det > 0 ? (s0 * r2 - s2 * r0) / det : Number.NaN;
    if (!(nextA2 >= 0 && nextB2 >= 0)) {
      // One part alone, whichever gives the data the higher Gaussian likelihood.
      const aOnly = r0 / s0;
      const bOnly = s4 > 0 ? r2 / s4 : 0;
      const useA = bOnly > 0 ? logLikelihood(e2, m2, aOnly, 0) >= logLikelihood(e2, m2, 0, bOnly) : true;
      nextA2 = useA ? aOnly : 0;
      nextB2 = useA ? 0 : bOnly;
    }
    const settled = Math.abs(nextA2 - a2) <= 1e-6 * (a2 + nextA2) && Math.abs(nextB2 - b2) <= 1e-6 * (b2 + nextB2);
    a2 = nextA2;
    b2 = nextB2;
    if (settled) break;
  }
  if (!Number.isFinite(a2) || !Number.isFinite(b2) || !(a2 + b2 > 0)) return null;
  // A fitted flux of zero with no constant part would be a point of infinite weight.
  if (!(a2 > 0) && !model.every((m) => m !== 0)) return null;
  // The flux fit used up two degrees of freedom of the residuals.
  const dofShare = n / Math.max(n - 2, 1);
  return { a2: a2 * dofShare, b2: (b2 * dofShare) / (top * top), model };
}

/** Most re-weightings of the variance regression; it settles in a handful. */
const VARIANCE_PASSES = 30;

/** Gaussian log-likelihood, up to a constant, of squared residuals e² under variances a² + b²m². */
function logLikelihood(e2: Float64Array, m2: Float64Array, a2: number, b2: number): number {
  let sum = 0;
  for (let i = 0; i < e2.length; i++) {
    const v = a2 + b2 * m2[i];
    sum -= v > 0 ? Math.log(v) + e2[i] / v : Infinity;
  }
  return sum;
}

/** How many times the noise model is re-estimated and the fit re-weighted; the weights settle after two or three. */
const NOISE_PASSES = 3;

/** Most points the fit settles on before it fits the whole spectrum: a longer one's every k-th point (fitPlanck). */
const SAMPLE_POINTS = 20_000;

/** The noise assumption in words: which part of σ² = a² + (bF)² dominates at the typical flux of the spectrum. */
function noiseWords(a2: number, b2: number, model: Float64Array): string {
  const typical = median(Array.from(model, Math.abs));
  const share = (b2 * typical * typical) / (a2 + b2 * typical * typical);
  const which =
    share > 0.8 ? 'mostly proportional to the flux' : share < 0.2 ? 'mostly the same at every point' : 'part the same at every point, part proportional to the flux';
  return `no flux uncertainties given; points weighted by the noise estimated from the scatter about the fit at each flux level (σ² = a² + (b·F)², here ${which})`;
}

/**
 * Least-squares fit of scale × B_λ(T) to a 1-D spectrum (wavelength in m).
 * A coarse grid in log T with the scale solved linearly gives the start;
 * Levenberg–Marquardt on (ln T, ln scale) refines it. Uncertainties are from
 * the inverse of JᵀWJ scaled by the reduced χ².
 *
 * The weights W are 1/σ² from the spectrum's flux uncertainties when it gives
 * them. Without them, equal weights would assume the same noise on every
 * point, and when the noise grows with the flux (the usual case) σ comes out
 * several times too small; so the noise is estimated from the scatter about
 * the fit as σᵢ² = a² + (b·Fᵢ)², which holds for noise the same at every
 * point, proportional to the flux, or both, and the fit is re-weighted by it.
 * `noise` says which assumption was used.
 * Out: temperature in K, ln scale.
 * Throws PhysicsError ('too_few_points', 'fit_failed') when no fit exists.
 * @see Press et al., Numerical Recipes (3rd ed.) §15.5, Levenberg–Marquardt (from memory); CODATA 2018 h, c, k_B
 */
export function fitPlanck(spectrum: Spectrum): PlanckFit {
  checkSpectrum(spectrum);
  const n = spectrum.wavelengthM.length;
  if (n < 4) throw new PhysicsError('too_few_points', 'temperature_planck', `a Planck fit needs at least 4 points (got ${n})`, '≥ 4 points');

  const points: Weighted = {
    wavelengthM: spectrum.wavelengthM,
    flux: spectrum.flux,
    weight: spectrum.fluxSigma ? Float64Array.from(spectrum.fluxSigma, (sigma) => 1 / (sigma * sigma)) : null,
  };
  const start = startingPoint(points);
  if (!Number.isFinite(start.lnT)) {
    throw new PhysicsError('fit_failed', 'temperature_planck', 'no positive Planck curve matches this spectrum');
  }
  let noise: PlanckNoise = { model: 'given', words: 'weighted by the flux uncertainties given' };
  let iterations = 0;
  /** Weights the points by the noise estimated from their scatter about the last fit, and fits them again; null when the scatter is zero. */
  const reweight = (fitted: Weighted, from: ReturnType<typeof refine>): { points: Weighted; result: ReturnType<typeof refine> } | null => {
    const level = noiseFromScatter(fitted, from.lnT, from.lnS);
    if (!level) return null;
    const { a2, b2, model } = level;
    const weighted = { ...fitted, weight: Float64Array.from(model, (m) => 1 / (a2 + b2 * m * m)) };
    noise = { model: 'flux_level', constant: Math.sqrt(a2), proportional: Math.sqrt(b2), words: noiseWords(a2, b2, model) };
    const refitted = refine(weighted, from);
    iterations += refitted.iterations;
    return { points: weighted, result: refitted };
  };
  // A long spectrum is fitted first at every k-th point (at most SAMPLE_POINTS), where the refinement and, without flux
  // uncertainties, the noise model settle; the whole is then fitted once more from there, so every point counts in the result.
  let sample = thinned(points, SAMPLE_POINTS);
  let result = refine(sample, start);
  iterations += result.iterations;
  if (!spectrum.fluxSigma) {
    noise = { model: 'flux_level', constant: 0, proportional: 0, words: 'no flux uncertainties given; the scatter about the fit is zero' };
    for (let pass = 0; pass < NOISE_PASSES; pass++) {
      const next = reweight(sample, result);
      if (!next) break;
      ({ points: sample, result } = next);
    }
  }
  if (sample.wavelengthM.length < n) {
    // Without flux uncertainties the whole is weighted by the noise its own scatter about the sample's fit gives.
    const whole = spectrum.fluxSigma ? null : reweight(points, result);
    if (whole) result = whole.result;
    else {
      result = refine(points, result);
      iterations += result.iterations;
    }
  }
  const { lnT, lnS, at: current } = result;

  const dof = n - 2;
  const [a, b, d] = current.jtj;
  const det = a * d - b * b;
  const temperature = Math.exp(lnT);
  if (!(det > 0) || !Number.isFinite(temperature) || !Number.isFinite(lnS)) {
    throw new PhysicsError('fit_failed', 'temperature_planck', 'the Planck fit did not converge: temperature and scale cannot be separated by these data');
  }
  const reducedChiSquare = current.chi2 / dof;
  const varLnT = (d / det) * reducedChiSquare;
  const varLnS = (a / det) * reducedChiSquare;
  const cov = (-b / det) * reducedChiSquare;
  const sigmaLnT = Math.sqrt(varLnT);
  const sigmaLnS = Math.sqrt(varLnS);

  const warnings: PhysicsWarning[] = [];
  let minL = Infinity;
  let maxL = -Infinity;
  for (const l of spectrum.wavelengthM) {
    minL = Math.min(minL, l);
    maxL = Math.max(maxL, l);
  }
  const peak = planckPeakWavelengthM(temperature);
  if (peak < minL || peak > maxL) {
    warnings.push({
      code: 'outside_calibration',
      quantity: 'temperature_planck',
      message: `the fitted curve peaks at ${(peak * 1e9).toFixed(0)} nm, outside the observed ${(minL * 1e9).toFixed(0)}–${(maxL * 1e9).toFixed(0)} nm; the temperature rests on one side of the curve only`,
      limit: `peak within ${(minL * 1e9).toFixed(0)}–${(maxL * 1e9).toFixed(0)} nm`,
    });
  }
  return {
    temperatureK: { value: temperature, sigma: temperature * sigmaLnT },
    logScale: { value: lnS, sigma: sigmaLnS },
    correlation: sigmaLnT > 0 && sigmaLnS > 0 ? cov / (sigmaLnT * sigmaLnS) : 0,
    chiSquare: current.chi2,
    degreesOfFreedom: dof,
    reducedChiSquare,
    iterations,
    noise,
    warnings,
  };
}

function median(values: readonly number[]): number {
  // A Float64Array sorts by number natively, without a compare callback per comparison.
  const sorted = Float64Array.from(values).sort();
  const m = sorted.length >> 1;
  return sorted.length % 2 ? sorted[m] : (sorted[m - 1] + sorted[m]) / 2;
}

/** Solves the 4 × 4 normal equations in place (Gauss–Jordan with partial pivoting); returns the inverse, or null when singular. */
function invert4(m: number[][]): number[][] | null {
  const n = 4;
  const a = m.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r][c]) > Math.abs(a[p][c])) p = r;
    if (Math.abs(a[p][c]) < 1e-300) return null;
    [a[c], a[p]] = [a[p], a[c]];
    const pivot = a[c][c];
    for (let j = 0; j < 2 * n; j++) a[c][j] /= pivot;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = a[r][c];
      for (let j = 0; j < 2 * n; j++) a[r][j] -= f * a[c][j];
    }
  }
  return a.map((row) => row.slice(n));
}

/** Share of the smoothed maximum that bounds the region fitted around the peak. */
const PEAK_REGION_FRACTION = 0.8;

/**
 * Share of the peak wavelength by which the cubic's own shape can miss a
 * blackbody's top (at most 1.4e-4 over 300–1500 nm for 4500–7000 K in
 * Starledger's noise-free synthetic spectra); σ never goes below it, so a
 * long, clean spectrum does not claim more than the method can give.
 */
const PEAK_SHAPE_ERROR = 2e-4;

/**
 * How far, in standard errors of the fitted curve, the continuum must fall
 * on each side of a peak for the turnover to count as seen rather than noise.
 * Three standard errors is common practice for a detection.
 */
const TURNOVER_SIGMAS = 3;

/**
 * Running median over `window` consecutive points (made odd, at most the
 * number of points). Near either end the window is kept whole and shifted
 * inward rather than shrunk, so that a few bad points at the end of a
 * spectrum never make up half of it.
 *
 * Cost n log n whatever the window: the values are ranked once by sorting,
 * the window is a Fenwick (binary indexed) tree of counts over those ranks,
 * and each median is the middle rank found by descending the tree.
 * @see P. M. Fenwick (1994), Software: Practice and Experience 24, 327 (from memory)
 */
export function runningMedian(values: readonly number[], window: number): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  if (n === 0) return out;
  let w = Math.max(1, Math.min(Math.floor(window), n));
  if (w % 2 === 0) w -= 1;
  const half = w >> 1;
  // Each point's rank is where its value stands in the sorted values (a binary search), ties taking the next free
  // place in the order they come, so every point has its own rank and a count of 1; pointAt[rank − 1] is that point.
  const sorted = Float64Array.from(values).sort();
  const rank = new Int32Array(n);
  const pointAt = new Int32Array(n);
  const tiesTaken = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let lo = 0;
    let hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (sorted[mid] < values[i]) lo = mid + 1;
      else hi = mid;
    }
    rank[i] = lo + tiesTaken[lo]++ + 1;
    pointAt[rank[i] - 1] = i;
  }
  const tree = new Int32Array(n + 1);
  const add = (r: number, delta: number) => {
    for (; r <= n; r += r & -r) tree[r] += delta;
  };
  let highBit = 1;
  while (highBit * 2 <= n) highBit *= 2;
  /** The k-th smallest rank in the window (1-based k). */
  const kth = (k: number) => {
    let pos = 0;
    for (let bit = highBit; bit > 0; bit >>= 1) {
      if (pos + bit <= n && tree[pos + bit] < k) {
        pos += bit;
        k -= tree[pos];
      }
    }
    return pos + 1;
  };
  for (let i = 0; i < w; i++) add(rank[i], 1);
  let lo = 0;
  for (let i = 0; i < n; i++) {
    const want = Math.min(Math.max(0, i - half), n - w);
    while (lo < want) {
      add(rank[lo], -1);
      add(rank[lo + w], 1);
      lo++;
    }
    out[i] = values[pointAt[kth(half + 1) - 1]];
  }
  return out;
}

interface CubicRow {
  x: number;
  y: number;
  weight: number;
}

/** Weighted least-squares cubic through the rows: coefficients and the inverse of the normal matrix, or null when singular. */
function fitCubic(rows: readonly CubicRow[]): { coef: number[]; inverse: number[][] } | null {
  if (rows.length < 4) return null;
  const normal = Array.from({ length: 4 }, () => [0, 0, 0, 0]);
  const rhs = [0, 0, 0, 0];
  for (const { x, y, weight } of rows) {
    const powers = [1, x, x * x, x * x * x];
    for (let a = 0; a < 4; a++) {
      rhs[a] += weight * powers[a] * y;
      for (let b = 0; b < 4; b++) normal[a][b] += weight * powers[a] * powers[b];
    }
  }
  const inverse = invert4(normal);
  if (!inverse) return null;
  return { coef: inverse.map((row) => row.reduce((sum, v, j) => sum + v * rhs[j], 0)), inverse };
}

/** The plain-words refusal when the continuum does not turn over inside the observed range. */
function peakOutside(lambda: readonly number[], why: string): PhysicsError {
  const range = `${(lambda[0] * 1e9).toFixed(1)}–${(lambda[lambda.length - 1] * 1e9).toFixed(1)} nm`;
  return new PhysicsError('peak_at_edge', 'peak_wavelength', `${why}; the peak lies outside the observed range (${range})`, range);
}

/**
 * Wavelength in m of the continuum peak of a spectrum sorted or unsorted by
 * wavelength, with its 1-sigma uncertainty.
 *
 * The flux is smoothed with a running median (window of `windowPoints`,
 * default one twentieth of the points, at least 5, kept whole at the ends) to
 * find the top of the continuum without being pulled by noise, absorption
 * lines or a few bad points at an end. A cubic in ln wavelength is then
 * fitted by least squares to ln flux at the measured points where the smoothed
 * flux is at least 80 % of its maximum, leaving out line cores and spikes
 * (points more than three robust standard deviations from the cubic, refitted
 * until none changes); a cubic rather than a
 * parabola because a blackbody's peak is lopsided, steeper on the blue side,
 * and in logarithms because there a blackbody's top is close to a cubic (the
 * shape error on the peak is about 0.02 % rather than 0.3 %). The peak is where
 * the cubic's slope is zero, and σ follows from the fit's covariance (scaled
 * by its residual variance, or weighted by the flux uncertainties when given)
 * by first-order propagation through that root, never below half a sampling
 * step nor below the cubic's shape error (0.02 % of the wavelength).
 *
 * A peak is reported only where the data turn over inside the range: the
 * cubic's maximum must lie inside the fitted window and the cubic must fall
 * from it to both ends of the window by more than three of its standard
 * errors. Otherwise the peak lies outside the observed range (a hot star seen
 * in the optical) and that is what the error says.
 *
 * The window, the 80 % region, the cubic and the three-σ turnover are
 * Starledger's own choices; the least-squares and propagation steps are
 * textbook (Bevington & Robinson, Data Reduction and Error Analysis, 3rd ed.,
 * ch. 7 and 3; from memory).
 * Throws PhysicsError('peak_at_edge') when the peak lies outside the observed
 * range, and ('fit_failed') when the region around it has too few points.
 * @see REFERENCES.md "Limits of the simple models"
 */
export function findContinuumPeak(spectrum: Spectrum, windowPoints?: number): Measured {
  checkSpectrum(spectrum);
  const n = spectrum.wavelengthM.length;
  if (n < 5) throw new PhysicsError('too_few_points', 'peak_wavelength', `finding a peak needs at least 5 points (got ${n})`, '≥ 5 points');
  const order = Array.from({ length: n }, (_, i) => i).sort((p, q) => spectrum.wavelengthM[p] - spectrum.wavelengthM[q]);
  const lambda = order.map((i) => spectrum.wavelengthM[i]);
  const flux = order.map((i) => spectrum.flux[i]);
  const fluxSigma = spectrum.fluxSigma ? order.map((i) => spectrum.fluxSigma![i]) : null;
  const smooth = runningMedian(flux, windowPoints ?? Math.max(5, Math.floor(n / 20)));
  let top = 0;
  for (let i = 1; i < n; i++) if (smooth[i] > smooth[top]) top = i;
  if (top === 0 || top === n - 1) {
    throw peakOutside(lambda, `the continuum rises to the ${top === 0 ? 'blue' : 'red'} end of the spectrum`);
  }
  let left = top;
  while (left > 0 && smooth[left - 1] >= PEAK_REGION_FRACTION * smooth[top]) left--;
  let right = top;
  while (right < n - 1 && smooth[right + 1] >= PEAK_REGION_FRACTION * smooth[top]) right++;
  const step = (lambda[Math.min(top + 1, n - 1)] - lambda[Math.max(top - 1, 0)]) / 2;

  // The cubic is in ln flux against ln wavelength, where a blackbody's top is nearly a cubic: in flux against
  // wavelength the cubic's own shape moves the peak by about 0.3 % over an 80 % region, more than the noise of a long spectrum.
  // Centred and scaled ln wavelength keeps the normal equations well conditioned.
  const centre = lambda[top];
  const span = Math.max(Math.log(lambda[right] / lambda[left]), step / centre);
  const all: CubicRow[] = [];
  for (let i = left; i <= right; i++) {
    if (flux[i] <= 0) continue;
    // σ(ln F) = σ(F) / F, taken at the smoothed flux so that a point's own noise does not set its weight.
    const relative = (fluxSigma ? fluxSigma[i] : 1) / smooth[i];
    all.push({ x: Math.log(lambda[i] / centre) / span, y: Math.log(flux[i]), weight: 1 / (relative * relative) });
  }
  // Line cores and spikes are left out by their distance from the fitted cubic itself, in robust standard deviations
  // of its residuals, refitting until the kept points stop changing; measured from the running median instead, the
  // cut would follow that curve's own bias about a rounded top and move the peak.
  let rows = all;
  let fitted = fitCubic(rows);
  for (let pass = 0; pass < 5 && fitted; pass++) {
    const { coef } = fitted;
    const spread = all.map(({ x, y, weight }) => Math.abs(y - (coef[0] + coef[1] * x + coef[2] * x * x + coef[3] * x * x * x)) * Math.sqrt(weight));
    const cut = 3 * 1.4826 * median(spread);
    const kept = all.filter((_, i) => spread[i] <= cut);
    if (kept.length === rows.length) break;
    rows = kept;
    fitted = fitCubic(rows);
  }
  if (rows.length < 6) {
    throw new PhysicsError(
      'fit_failed',
      'peak_wavelength',
      `too few points around the continuum peak to locate it (${rows.length} within 80 % of the maximum)`,
      '≥ 6 points',
    );
  }
  if (!fitted) throw new PhysicsError('fit_failed', 'peak_wavelength', 'the points around the continuum peak do not determine a curve (too few distinct wavelengths)');
  const { coef, inverse } = fitted;
  const cubic = (x: number) => coef[0] + coef[1] * x + coef[2] * x * x + coef[3] * x * x * x;
  let chi2 = 0;
  for (const { x, y, weight } of rows) chi2 += weight * (y - cubic(x)) ** 2;
  // Without flux uncertainties the weights assume equal noise in flux and the scatter sets the scale; with them, χ²/dof scales a poor fit up, never down.
  const scale = fluxSigma ? Math.max(1, chi2 / (rows.length - 4)) : chi2 / (rows.length - 4);
  /** Variance of gᵀc, for a gradient g with respect to the cubic's coefficients. */
  const varianceOf = (g: readonly number[]) => {
    let v = 0;
    for (let a = 0; a < 4; a++) for (let b = 0; b < 4; b++) v += g[a] * inverse[a][b] * g[b];
    return Math.max(0, v * scale);
  };

  // Slope zero: c1 + 2 c2 x + 3 c3 x² = 0, the root nearest the smoothed top with a maximum there.
  const [, c1, c2, c3] = coef;
  const candidates: number[] = [];
  if (Math.abs(c3) < 1e-12 * Math.max(Math.abs(c1), Math.abs(c2), 1e-300)) {
    if (c2 < 0) candidates.push(-c1 / (2 * c2));
  } else {
    const disc = 4 * c2 * c2 - 12 * c3 * c1;
    if (disc >= 0) for (const sign of [1, -1]) candidates.push((-2 * c2 + sign * Math.sqrt(disc)) / (6 * c3));
  }
  const xMin = rows[0].x;
  const xMax = rows[rows.length - 1].x;
  const windowWords = `${(lambda[left] * 1e9).toFixed(1)}–${(lambda[right] * 1e9).toFixed(1)} nm`;
  const roots = candidates.filter((x) => 2 * c2 + 6 * c3 * x < 0 && x > xMin && x < xMax).sort((p, q) => Math.abs(p) - Math.abs(q));
  if (roots.length === 0) throw peakOutside(lambda, `the continuum does not turn over between ${windowWords} (the curve fitted there has no maximum inside it)`);
  const x = roots[0];
  // The fall from the top to each end of the window; at the top the slope is zero, so only the coefficients move it to first order.
  for (const [end, side] of [
    [xMin, 'blue'],
    [xMax, 'red'],
  ] as const) {
    const drop = cubic(x) - cubic(end);
    const sigmaDrop = Math.sqrt(varianceOf([0, x - end, x * x - end * end, x * x * x - end * end * end]));
    if (!(drop > TURNOVER_SIGMAS * sigmaDrop)) {
      throw peakOutside(lambda, `the continuum does not fall on the ${side} side of its highest point (${windowWords}) by more than the noise`);
    }
  }
  const curvature = 2 * c2 + 6 * c3 * x;
  // ∂x/∂cₖ = −(∂slope/∂cₖ) / curvature, with ∂slope/∂(c0, c1, c2, c3) = (0, 1, 2x, 3x²).
  const g = [0, 1, 2 * x, 3 * x * x].map((d) => -d / curvature);
  const peak = centre * Math.exp(x * span);
  const sigma = Math.max(peak * span * Math.sqrt(varianceOf(g)), step / 2, PEAK_SHAPE_ERROR * peak);
  return { value: peak, sigma };
}
