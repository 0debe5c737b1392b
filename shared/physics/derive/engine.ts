import { QUANTITY_IDS, type QuantityId } from '../quantities';
import { evaluate } from './evaluate';
import type { DerivationGraph, DeriveOptions, MeasurementId, MeasurementInput } from './types';

/**
 * Derives everything a target's measurements allow, by the derivation table
 * (nodes.ts) with correlated Monte Carlo draws (evaluate.ts). Never throws on
 * bad measurements: a refused measurement or a quantity that cannot be
 * computed becomes an entry of `issues` naming the quantity, the code and
 * the limit. Pass each target its own `seed` (the server derives it from the
 * project and the target) so that no two targets share draws.
 * @see PRODUCT.md "Derivations"; each quantity's own module for its source
 */
export function deriveAll(measurements: readonly MeasurementInput[], options: DeriveOptions = {}): DerivationGraph {
  return evaluate(measurements, options);
}

/**
 * The quantities whose value or warnings rest on a measurement in this
 * graph, transitively, in table order: what to re-derive when it changes.
 * @see PRODUCT.md "Derivations": a new measurement re-derives only what depends on it
 */
export function affectedQuantities(graph: DerivationGraph, measurementId: MeasurementId): QuantityId[] {
  const hit = new Set<QuantityId>();
  for (const q of QUANTITY_IDS) {
    if (graph.results[q]?.inputs.includes(measurementId)) hit.add(q);
  }
  for (const issue of graph.issues) {
    if (issue.measurementId === measurementId && issue.quantity) hit.add(issue.quantity);
  }
  let grew = true;
  while (grew) {
    grew = false;
    for (const q of QUANTITY_IDS) {
      const r = graph.results[q];
      if (!r || hit.has(q)) continue;
      if ([...r.dependsOn, ...r.checkedAgainst].some((d) => hit.has(d))) {
        hit.add(q);
        grew = true;
      }
    }
  }
  return QUANTITY_IDS.filter((q) => hit.has(q));
}
