import type { PhysicsWarning, PhysicsWarningCode } from '../errors';
import { inverseVarianceMean, type Measured } from '../measured';

/** Estimates further apart than this many combined σ are named in a warning. */
export const DISAGREEMENT_SIGMA = 3;

/** Repeated estimates of one quantity, combined, with what the combination found. */
export interface Combined {
  /** The combination at the estimates' values. */
  readonly value: number;
  /** Weight of each estimate (they sum to 1). */
  readonly weights: readonly number[];
  /**
   * Factor by which the draws' spread about the combination is widened:
   * the Birge ratio when it exceeds 1, else 1.
   */
  readonly scale: number;
  /** Birge ratio R_B = √(χ² / (n − 1)); null for one estimate or an unweighted mean. */
  readonly birgeRatio: number | null;
  /** False when an estimate had no σ, so that the plain mean was taken. */
  readonly weighted: boolean;
  /** For a plain mean: the standard error of the mean from the estimates' scatter (0 for one). */
  readonly standardError: number;
  /** One per pair of estimates further apart than DISAGREEMENT_SIGMA combined σ, the most apart first (MOST_DISCORDANT_PAIRS of them), and one that counts the rest. */
  readonly warnings: PhysicsWarning[];
  /** Words for the method line: what was done to σ, or "". */
  readonly note: string;
}

/**
 * The one rule by which Starledger combines repeated estimates of a
 * quantity (parallaxes, fluxes, magnitudes, colours, E(B−V), temperatures,
 * line velocities): the inverse-variance mean; every pair further apart
 * than 3 combined σ, |xᵢ − xⱼ| > 3 √(σᵢ² + σⱼ²), is counted, the ten most
 * apart named in a warning each and the rest in one more; and
 * when the estimates scatter more than their σ allow, the Birge ratio
 * R_B = √(χ² / (n − 1)), χ² = Σ ((xᵢ − x̄) / σᵢ)², widens σ by R_B when it
 * exceeds 1 (the Particle Data Group's scale factor S). With an estimate
 * that has no σ the weights are undefined: the plain mean is taken, its σ
 * the standard error of the mean.
 * @see R. T. Birge (1932), The calculation of errors by the method of least squares, Phys. Rev. 40, 207
 * @see Particle Data Group, R. L. Workman et al. (2022), PTEP 2022, 083C01, Introduction §5.2.2 (the scale factor S; from memory)
 * @see Bevington & Robinson, Data Reduction and Error Analysis (3rd ed.), §4.1 (from memory)
 */
export function combineEstimates(
  estimates: readonly Measured[],
  names: readonly string[],
  what: string,
  quantity: string,
  code: Extract<PhysicsWarningCode, 'measurements_disagree' | 'temperatures_disagree'>,
): Combined {
  const n = estimates.length;
  if (n === 1) return { value: estimates[0].value, weights: [1], scale: 1, birgeRatio: null, weighted: estimates[0].sigma > 0, standardError: 0, warnings: [], note: '' };
  const combination = inverseVarianceMean(estimates, quantity, DISAGREEMENT_SIGMA);
  const weighted = combination.weighted;
  let weights: number[];
  if (weighted) {
    const sigmaMin = Math.min(...estimates.map((e) => e.sigma));
    const raw = estimates.map((e) => (sigmaMin / e.sigma) ** 2);
    const sum = raw.reduce((s, w) => s + w, 0);
    weights = raw.map((w) => w / sum);
  } else {
    weights = estimates.map(() => 1 / n);
  }
  const birgeRatio = weighted ? Math.sqrt(combination.chiSquare / combination.degreesOfFreedom) : null;
  const scale = birgeRatio !== null && birgeRatio > 1 ? birgeRatio : 1;
  const note =
    scale > 1
      ? `σ widened by the Birge ratio R_B = √(χ²/(n−1)) = ${scale.toFixed(2)} because the ${what} scatter more than their errors allow`
      : weighted
        ? ''
        : 'plain mean, σ the standard error of the mean (an estimate has no σ)';
  const warnings = combination.discordantPairs.map(([i, j]): PhysicsWarning => {
    const a = estimates[i];
    const b = estimates[j];
    const apart = Math.abs(a.value - b.value) / Math.hypot(a.sigma, b.sigma);
    return {
      code,
      quantity,
      message: `${what}: ${names[i]} and ${names[j]} differ by ${apart.toFixed(1)} σ (more than ${DISAGREEMENT_SIGMA} σ)${scale > 1 ? `; the combined σ is widened by the Birge ratio ${scale.toFixed(2)}` : ''}`,
      limit: `${DISAGREEMENT_SIGMA} σ`,
    };
  });
  const unnamed = combination.discordantPairCount - combination.discordantPairs.length;
  if (unnamed > 0) {
    warnings.push({
      code,
      quantity,
      message: `${what}: ${unnamed.toLocaleString('en-GB')} more ${unnamed === 1 ? 'pair differs' : 'pairs differ'} by more than ${DISAGREEMENT_SIGMA} σ (the ${combination.discordantPairs.length} most apart are named)`,
      limit: `${DISAGREEMENT_SIGMA} σ`,
    });
  }
  return { value: combination.mean.value, weights, scale, birgeRatio, weighted, standardError: weighted ? 0 : combination.mean.sigma, warnings, note };
}

/**
 * The draws of a combination: per draw the same weighted mean of the
 * estimates' draws, its spread about the combined value widened by the
 * Birge ratio, and for a plain mean the standard error of the mean added
 * as a deviate of its own (`extra`, standard normal draws). Writes `out`.
 */
export function combineDraws(combined: Combined, inputs: readonly Float64Array[], extra: Float64Array | null, out: Float64Array): void {
  const { weights, scale, value, standardError } = combined;
  out.fill(0);
  for (let i = 0; i < inputs.length; i++) {
    const x = inputs[i];
    const w = weights[i];
    for (let s = 0; s < out.length; s++) out[s] += w * x[s];
  }
  if (scale !== 1) for (let s = 0; s < out.length; s++) out[s] = value + scale * (out[s] - value);
  if (extra && standardError > 0) for (let s = 0; s < out.length; s++) out[s] += standardError * extra[s];
}
