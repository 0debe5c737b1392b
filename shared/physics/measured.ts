import { PhysicsError, requireFinite, requireFiniteResult, requireUncertainty } from './errors';

/**
 * A measured or derived value with its 1-sigma standard uncertainty, in the
 * unit the caller's parameter name gives. sigma = 0 means "no uncertainty
 * known", not "exact"; the engine warns when it meets one.
 */
export interface Measured {
  readonly value: number;
  readonly sigma: number;
}

/**
 * Creates a Measured after checking that value is finite and sigma finite and ≥ 0.
 * @see JCGM 100:2008 (GUM), standard uncertainty
 */
export function measured(value: number, sigma: number, quantity: string): Measured {
  requireFinite(value, quantity);
  requireUncertainty(sigma, quantity);
  return { value, sigma };
}

/** One factor x^power of a power law. */
export interface PowerFactor {
  readonly x: Measured;
  readonly power: number;
  readonly name: string;
}

/**
 * First-order propagation through y = coefficient × Π xᵢ^kᵢ with independent
 * inputs: (σ_y / y)² = Σ (kᵢ σᵢ / xᵢ)². Every xᵢ must be > 0. The result is in
 * whatever unit the coefficient and factors make.
 * @see REFERENCES.md "Uncertainties"; JCGM 100:2008 (GUM) §5.1.6
 */
export function powerLaw(coefficient: number, factors: readonly PowerFactor[], quantity: string): Measured {
  let value = coefficient;
  let relativeVariance = 0;
  for (const f of factors) {
    if (!(f.x.value > 0)) {
      throw new PhysicsError('non_positive', f.name, `${f.name} must be greater than 0 (got ${f.x.value})`, '> 0');
    }
    value *= Math.pow(f.x.value, f.power);
    const r = (f.power * f.x.sigma) / f.x.value;
    relativeVariance += r * r;
  }
  requireFiniteResult(value, quantity);
  return { value, sigma: requireFiniteResult(Math.abs(value) * Math.sqrt(relativeVariance), quantity) };
}

/**
 * First-order propagation through any smooth f of independent inputs, with
 * partial derivatives by central differences (step 10⁻⁴ σ; inputs with σ = 0
 * contribute nothing). Inputs that make f throw propagate the error.
 * @see JCGM 100:2008 (GUM) §5.1.2, the law of propagation of uncertainty
 */
export function firstOrder(f: (x: readonly number[]) => number, inputs: readonly Measured[], quantity: string): Measured {
  const nominal = inputs.map((m) => m.value);
  const value = requireFiniteResult(f(nominal), quantity);
  let variance = 0;
  for (let i = 0; i < inputs.length; i++) {
    const sigma = inputs[i].sigma;
    if (sigma === 0) continue;
    const h = sigma * 1e-4;
    const up = nominal.slice();
    const down = nominal.slice();
    up[i] += h;
    down[i] -= h;
    const derivative = (f(up) - f(down)) / (2 * h);
    variance += (derivative * sigma) ** 2;
  }
  return { value, sigma: requireFiniteResult(Math.sqrt(variance), quantity) };
}

/** Result of combining independent estimates of one quantity. */
export interface Combination {
  readonly mean: Measured;
  /** Σ ((xᵢ − mean) / σᵢ)², or 0 when weights were unavailable. */
  readonly chiSquare: number;
  readonly degreesOfFreedom: number;
  /** False when some estimate had σ = 0 and an unweighted mean was used. */
  readonly weighted: boolean;
  /**
   * The pairs (i, j) that differ by more than `threshold` combined σ, most
   * apart first, at most MOST_DISCORDANT_PAIRS of them: a star observed a
   * thousand times can have hundreds of thousands of such pairs.
   */
  readonly discordantPairs: ReadonlyArray<readonly [number, number]>;
  /** How many pairs differ by more than `threshold` combined σ, all of them counted. */
  readonly discordantPairCount: number;
}

/** How many of the pairs that disagree a combination names (the most apart); the rest are counted. */
export const MOST_DISCORDANT_PAIRS = 10;

/**
 * Inverse-variance weighted mean of independent estimates, σ = (Σ 1/σᵢ²)^-½.
 * Pairs differing by more than `thresholdSigma` × √(σᵢ² + σⱼ²) are counted,
 * and the MOST_DISCORDANT_PAIRS most apart listed.
 * When any σᵢ is 0 the weights are undefined and the plain mean is returned,
 * with the standard error of the mean as σ (0 for a single estimate).
 * @see Bevington & Robinson, Data Reduction and Error Analysis (3rd ed.), §4.1 (from memory)
 */
export function inverseVarianceMean(estimates: readonly Measured[], quantity: string, thresholdSigma = 3): Combination {
  if (estimates.length === 0) throw new PhysicsError('missing_input', quantity, `no estimates of ${quantity} to combine`);
  // Every pair is compared; the most apart are kept in order, by how many combined σ they differ.
  const worst: { pair: readonly [number, number]; apart: number }[] = [];
  let discordantPairCount = 0;
  for (let i = 0; i < estimates.length; i++) {
    for (let j = i + 1; j < estimates.length; j++) {
      const a = estimates[i];
      const b = estimates[j];
      const combined = Math.hypot(a.sigma, b.sigma);
      const difference = Math.abs(a.value - b.value);
      if (!(difference > thresholdSigma * combined)) continue;
      discordantPairCount++;
      const apart = difference / combined;
      if (worst.length === MOST_DISCORDANT_PAIRS && !(apart > worst[worst.length - 1].apart)) continue;
      let k = worst.length;
      while (k > 0 && apart > worst[k - 1].apart) k--;
      worst.splice(k, 0, { pair: [i, j], apart });
      if (worst.length > MOST_DISCORDANT_PAIRS) worst.pop();
    }
  }
  const discordantPairs = worst.map((w) => w.pair);
  const n = estimates.length;
  if (estimates.some((e) => e.sigma === 0)) {
    const mean = estimates.reduce((s, e) => s + e.value, 0) / n;
    const spread = n > 1 ? Math.sqrt(estimates.reduce((s, e) => s + (e.value - mean) ** 2, 0) / (n - 1) / n) : 0;
    return { mean: { value: mean, sigma: spread }, chiSquare: 0, degreesOfFreedom: n - 1, weighted: false, discordantPairs, discordantPairCount };
  }
  // Weights relative to the smallest σ keep Σw finite even for σ near the
  // smallest double, where 1/σ² overflows.
  const sigmaMin = Math.min(...estimates.map((e) => e.sigma));
  let sumW = 0;
  let sumWx = 0;
  for (const e of estimates) {
    const w = (sigmaMin / e.sigma) ** 2;
    sumW += w;
    sumWx += w * e.value;
  }
  const mean = sumWx / sumW;
  let chiSquare = 0;
  for (const e of estimates) chiSquare += ((e.value - mean) / e.sigma) ** 2;
  return {
    mean: { value: requireFiniteResult(mean, quantity), sigma: requireFiniteResult(sigmaMin / Math.sqrt(sumW), quantity) },
    chiSquare,
    degreesOfFreedom: n - 1,
    weighted: true,
    discordantPairs,
    discordantPairCount,
  };
}
