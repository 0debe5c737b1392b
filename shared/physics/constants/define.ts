import { PhysicsError } from '../errors';

/**
 * One physical or astronomical constant as published.
 * `uncertainty` is the standard uncertainty in `unit`; 0 means exact (by
 * definition, or derived only from exact constants).
 */
export interface PhysicalConstant {
  readonly symbol: string;
  readonly name: string;
  readonly value: number;
  readonly unit: string;
  readonly uncertainty: number;
  /** The publication that gives the value; for a derived constant, its derivation too. */
  readonly reference: string;
}

/**
 * Creates a frozen constant record. A constant without a name, unit or
 * reference, or with a non-finite value or a negative uncertainty, cannot be
 * created: the source is part of the value.
 * @see astropy.constants' record layout (symbol, name, value, unit, uncertainty, reference), the model in CONVENTIONS.md
 */
export function defineConstant(record: PhysicalConstant): PhysicalConstant {
  for (const field of ['symbol', 'name', 'unit', 'reference'] as const) {
    const text = record[field];
    if (typeof text !== 'string' || text.trim() === '') {
      throw new PhysicsError('missing_input', record.symbol || 'constant', `constant ${record.symbol || '(no symbol)'} has no ${field}`);
    }
  }
  if (!Number.isFinite(record.value)) {
    throw new PhysicsError('not_finite', record.symbol, `constant ${record.symbol} has a non-finite value`);
  }
  if (!Number.isFinite(record.uncertainty) || record.uncertainty < 0) {
    throw new PhysicsError('negative_uncertainty', record.symbol, `constant ${record.symbol} has an invalid uncertainty`);
  }
  return Object.freeze({ ...record });
}
