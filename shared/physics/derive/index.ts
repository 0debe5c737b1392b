/**
 * The derivation engine: from one target's measurements to every quantity
 * they allow, with uncertainty, method, inputs, constants and warnings.
 */
export { affectedQuantities, deriveAll } from './engine';
export { dependentsOf, dependentsOfOption, QUANTITY_DEPENDENCIES } from './dependencies';
export type {
  DerivationGraph,
  DerivationIssue,
  DerivedResult,
  DeriveOptions,
  MeasurementId,
  MeasurementInput,
  Propagation,
  ResolvedOptions,
} from './types';
