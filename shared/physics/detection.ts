import { upperLimitText } from './display';
import type { PhysicsWarning } from './errors';
import type { Measured } from './measured';
import type { QuantityId } from './quantities';

/**
 * Non-detections. A line separation measured as 0 ± σ (no rotation, no
 * field seen) is data, and so is any size smaller than a few σ: the value is
 * kept as measured and the result carries an upper limit for the sheet.
 */

/**
 * A size below this many σ counts as not detected: the usual 3σ detection
 * threshold (common practice).
 */
export const DETECTION_THRESHOLD_SIGMA = 3;

/** Quantities that are sizes (≥ 0), for which a value within a few σ of 0 is a non-detection. */
const SIZES: ReadonlySet<QuantityId> = new Set<QuantityId>(['rotation_velocity', 'magnetic_field']);

/**
 * The 1σ upper limit of a size measured as value ± σ: the value (or 0,
 * were it negative) plus σ, in the value's unit.
 * @see DETECTION_THRESHOLD_SIGMA (common practice)
 */
export function upperLimitSi(size: Measured): number {
  return Math.max(size.value, 0) + size.sigma;
}

/**
 * An `upper_limit` warning, whose `limit` reads "< 0.46 km s⁻¹ (1σ)", when
 * a size lies below 3σ; nothing for a detection, for a value without σ or
 * for quantities that are not sizes (a radial velocity of 0 is a value).
 * @see DETECTION_THRESHOLD_SIGMA (common practice)
 */
export function nonDetectionWarnings(quantity: QuantityId, size: Measured): PhysicsWarning[] {
  if (!SIZES.has(quantity) || !(size.sigma > 0) || size.value >= DETECTION_THRESHOLD_SIGMA * size.sigma) return [];
  const limit = upperLimitText(quantity, upperLimitSi(size));
  return [
    {
      code: 'upper_limit',
      quantity,
      message: `not detected: the value lies below ${DETECTION_THRESHOLD_SIGMA} σ, so it is an upper limit, ${limit}`,
      limit,
    },
  ];
}
