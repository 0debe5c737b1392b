import type { MeasurementKind, QuantityId } from '../quantities';
import { QUANTITY_IDS } from '../quantities';
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

export const QUANTITY_DEPENDENCIES: Readonly<Record<QuantityId, QuantityDependencies>> = Object.freeze({
  temperature_wien: { kinds: ['peak_wavelength'], quantities: [], options: [] },
  temperature_colour: { kinds: ['colour_index', 'magnitude', 'extinction'], quantities: [], options: ['monteCarloSamples', 'seed'] },
  temperature_planck: { kinds: ['planck_temperature'], quantities: [], options: [] },
  temperature: { kinds: [], quantities: ['temperature_wien', 'temperature_colour', 'temperature_planck'], options: [] },
  spectral_class: { kinds: [], quantities: ['temperature'], options: [] },
  bolometric_flux: {
    kinds: ['bolometric_flux', 'magnitude', 'extinction'],
    quantities: ['temperature'],
    options: ['rV', 'monteCarloSamples', 'seed'],
  },
  distance_parallax: { kinds: ['parallax'], quantities: [], options: [] },
  luminosity: { kinds: ['distance', 'luminosity'], quantities: ['bolometric_flux', 'distance_parallax'], options: [] },
  radius: { kinds: [], quantities: ['luminosity', 'temperature'], options: ['assumedClass'] },
  luminosity_class: { kinds: [], quantities: ['temperature', 'luminosity'], options: [] },
  luminosity_hr: { kinds: [], quantities: ['temperature', 'luminosity_class'], options: ['assumedClass', 'monteCarloSamples', 'seed'] },
  distance_photometric: {
    kinds: ['luminosity'],
    quantities: ['temperature', 'bolometric_flux', 'distance_parallax'],
    options: ['assumedClass', 'monteCarloSamples', 'seed'],
  },
  absolute_bolometric_magnitude: { kinds: [], quantities: ['luminosity'], options: [] },
  radial_velocity: { kinds: ['line_wavelength'], quantities: [], options: [] },
  rotation_velocity: { kinds: ['limb_separation'], quantities: [], options: [] },
  magnetic_field: { kinds: ['zeeman_separation'], quantities: [], options: [] },
});

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
