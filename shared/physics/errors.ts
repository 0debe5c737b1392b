/**
 * Typed errors and warnings of the physics core.
 *
 * The `code` is the contract (the server maps it to wording and status, the
 * engine records it in an issue list); the message is for people and may change.
 */

/** Stable error codes raised by the physics functions. */
export type PhysicsErrorCode =
  | 'not_finite'
  | 'non_positive'
  | 'negative'
  | 'negative_uncertainty'
  | 'unknown_unit'
  | 'unknown_kind'
  | 'out_of_range'
  | 'missing_input'
  | 'fit_failed'
  | 'peak_at_edge'
  | 'too_few_points'
  | 'unphysical';

/**
 * An input a physics function refuses: never answered with NaN, Infinity or a clamp.
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export class PhysicsError extends Error {
  readonly code: PhysicsErrorCode;
  /** The quantity (measurement kind, derived quantity id or parameter name) that was refused. */
  readonly quantity: string;
  /** The limit that was crossed, in words with its unit, when there is one. */
  readonly limit?: string;

  constructor(code: PhysicsErrorCode, quantity: string, message: string, limit?: string) {
    super(message);
    this.name = 'PhysicsError';
    this.code = code;
    this.quantity = quantity;
    if (limit !== undefined) this.limit = limit;
  }
}

/** Stable warning codes: the value was computed but should be read with care. */
export type PhysicsWarningCode =
  | 'outside_calibration'
  | 'parallax_low_snr'
  | 'temperatures_disagree'
  | 'distances_disagree'
  | 'radius_implausible_for_class'
  | 'extinction_assumed_zero'
  | 'extinction_negative'
  | 'uncertainty_missing'
  | 'monte_carlo_rejected'
  | 'measurements_disagree'
  | 'assumed_class'
  | 'bc_zero_point'
  | 'upper_limit'
  | 'class_boundary'
  | 'implausible';

/** A caution attached to a computed value; it names the quantity and the limit. */
export interface PhysicsWarning {
  code: PhysicsWarningCode;
  quantity: string;
  message: string;
  limit?: string;
}

/**
 * Throws PhysicsError('not_finite') unless `value` is a finite number.
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export function requireFinite(value: number, quantity: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new PhysicsError('not_finite', quantity, `${quantity} must be a finite number (got ${String(value)})`, 'finite');
  }
  return value;
}

/**
 * Throws unless `value` is finite and strictly positive.
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export function requirePositive(value: number, quantity: string): number {
  requireFinite(value, quantity);
  if (value <= 0) {
    throw new PhysicsError('non_positive', quantity, `${quantity} must be greater than 0 (got ${value})`, '> 0');
  }
  return value;
}

/**
 * Throws PhysicsError('negative') unless `value` is finite and ≥ 0: for a
 * measured size such as a line separation, where 0 (nothing detected) is data.
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export function requireNonNegative(value: number, quantity: string): number {
  requireFinite(value, quantity);
  if (value < 0) {
    throw new PhysicsError('negative', quantity, `${quantity} must be 0 or more (got ${value})`, '≥ 0');
  }
  return value;
}

/**
 * Throws unless `sigma` is finite and not negative (0 means "no uncertainty given").
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export function requireUncertainty(sigma: number, quantity: string): number {
  if (typeof sigma !== 'number' || !Number.isFinite(sigma)) {
    throw new PhysicsError('not_finite', quantity, `uncertainty of ${quantity} must be a finite number (got ${String(sigma)})`, 'finite');
  }
  if (sigma < 0) {
    throw new PhysicsError('negative_uncertainty', quantity, `uncertainty of ${quantity} must be ≥ 0 (got ${sigma})`, '≥ 0');
  }
  return sigma;
}

/**
 * Guards a computed result: a non-finite value here is refused rather than returned.
 * @see PRODUCT.md "Derivations": bad input gives a clear typed error, never NaN or Infinity
 */
export function requireFiniteResult(value: number, quantity: string): number {
  if (!Number.isFinite(value)) {
    throw new PhysicsError('out_of_range', quantity, `${quantity} cannot be computed from these inputs (the result is not a finite number)`, 'finite result');
  }
  return value;
}
