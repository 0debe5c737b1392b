import type { MeasurementKind, QuantityId } from '../quantities';
import { QUANTITY_IDS } from '../quantities';
import { DERIVATION_NODES } from './nodes';
import type { DeriveOptions } from './types';

/**
 * What each derived quantity can depend on, whichever route the engine takes:
 * measurement kinds, other quantities (including those it is only
 * cross-checked against) and options. Used to say which quantities a change
 * can touch before anything is computed.
 */
export interface QuantityDependencies {
  readonly kinds: readonly MeasurementKind[];
  readonly quantities: readonly QuantityId[];
  readonly options: readonly (keyof DeriveOptions)[];
}

/** Every σ comes from the Monte Carlo draws, so these two options touch every quantity. */
const DRAW_OPTIONS: readonly (keyof DeriveOptions)[] = ['monteCarloSamples', 'seed'];

/**
 * Read from the derivation table (nodes.ts), the one place the graph is written.
 * @see DERIVATION_NODES
 */
export const QUANTITY_DEPENDENCIES: Readonly<Record<QuantityId, QuantityDependencies>> = Object.freeze(
  Object.fromEntries(
    DERIVATION_NODES.map((node) => [
      node.quantity,
      Object.freeze({
        kinds: Object.freeze([...node.kinds]),
        quantities: Object.freeze([...node.quantities, ...node.checks]),
        options: Object.freeze([...node.options, ...DRAW_OPTIONS]),
      }),
    ]),
  ) as Record<QuantityId, QuantityDependencies>,
);

function closure(seed: (q: QuantityId) => boolean): QuantityId[] {
  const hit = new Set<QuantityId>(QUANTITY_IDS.filter(seed));
  let grew = true;
  while (grew) {
    grew = false;
    for (const q of QUANTITY_IDS) {
      if (!hit.has(q) && QUANTITY_DEPENDENCIES[q].quantities.some((d) => hit.has(d))) {
        hit.add(q);
        grew = true;
      }
    }
  }
  return QUANTITY_IDS.filter((q) => hit.has(q));
}

/**
 * Every quantity whose value or warnings can change when a measurement of
 * this kind is added, edited or removed (transitively), in table order.
 * @see PRODUCT.md "Derivations": a new measurement re-derives only what depends on it
 */
export function dependentsOf(kind: MeasurementKind): QuantityId[] {
  return closure((q) => QUANTITY_DEPENDENCIES[q].kinds.includes(kind));
}

/**
 * Every quantity whose value or warnings can change with this option.
 * @see QUANTITY_DEPENDENCIES
 */
export function dependentsOfOption(option: keyof DeriveOptions): QuantityId[] {
  return closure((q) => QUANTITY_DEPENDENCIES[q].options.includes(option));
}
