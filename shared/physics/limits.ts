import { CONSTANTS } from './constants';
import { PhysicsError, type PhysicsWarning } from './errors';
import { QUANTITY_SI_UNIT, type QuantityId } from './quantities';

/**
 * What a star can be. A result beyond a physical limit (a speed at or above
 * c) or far outside every known star is refused; one merely outside the
 * stars Starledger is built for is kept with a warning. The limits are in SI,
 * each with where it comes from.
 */

const C = CONSTANTS.c.value;
const R_SUN = CONSTANTS.R_sun.value;
const L_SUN = CONSTANTS.L_sun.value;

/** One bound: the value in SI, how the refusal or warning names it, and why. */
interface Bound {
  readonly si: number;
  readonly words: string;
  readonly why: string;
}

/** The bounds of one quantity; speeds are bounded in magnitude (either sign). */
interface QuantityLimits {
  readonly magnitude?: boolean;
  readonly refuseBelow?: Bound;
  readonly refuseAbove?: Bound;
  readonly warnBelow?: Bound;
  readonly warnAbove?: Bound;
}

const SPEED: QuantityLimits = {
  magnitude: true,
  refuseAbove: { si: C, words: '< c = 299 792 458 m/s', why: 'no body moves at or faster than light (c exact, SI definition)' },
};

const TEMPERATURE: QuantityLimits = {
  refuseBelow: {
    si: 250,
    words: '≥ 250 K',
    why: 'colder than the coldest known brown dwarf, about 250 K (WISE 0855−0714, Luhman 2014; from memory)',
  },
  refuseAbove: {
    si: 1e6,
    words: '≤ 1 000 000 K',
    why: 'four times the hottest known stellar photospheres, about 250 000 K (the hottest white dwarfs and Wolf–Rayet stars; from memory)',
  },
  warnBelow: { si: 2330, words: '≥ 2330 K', why: 'cooler than the coolest star of the mean dwarf sequence, M9.5V at 2330 K (Pecaut & Mamajek 2013): a brown dwarf, or a wrong temperature' },
  warnAbove: { si: 250_000, words: '≤ 250 000 K', why: 'hotter than any known stellar photosphere (about 250 000 K; from memory)' },
};

/**
 * The limits per derived quantity, in its SI unit (QUANTITY_SI_UNIT).
 * Speeds: c is a law. Temperatures, radii and luminosities: far outside the
 * known extremes is refused, outside them warned; the extremes are from
 * memory where so marked.
 */
export const PHYSICAL_LIMITS: Readonly<Partial<Record<QuantityId, QuantityLimits>>> = Object.freeze({
  radial_velocity: {
    ...SPEED,
    warnAbove: {
      si: 2e6,
      words: '|v| ≤ 2000 km/s',
      why: 'faster than the fastest known hypervelocity star, about 1700 km/s (S5-HVS1, Koposov et al. 2020; from memory)',
    },
  },
  rotation_velocity: {
    ...SPEED,
    warnAbove: {
      si: 1e6,
      words: '≤ 1000 km/s',
      why: 'faster than any measured v sin i of a star that is not a compact remnant, the fastest about 600 km/s (VFTS 102, Dufton et al. 2011; from memory)',
    },
  },
  temperature_wien: TEMPERATURE,
  temperature_colour: TEMPERATURE,
  temperature_planck: TEMPERATURE,
  temperature: TEMPERATURE,
  radius: {
    refuseBelow: { si: 1e-5 * R_SUN, words: '≥ 10⁻⁵ R☉ (7 km)', why: 'smaller than a neutron star, about 12 km (from memory)' },
    refuseAbove: { si: 1e4 * R_SUN, words: '≤ 10 000 R☉', why: 'five times the largest known stars, about 2000 R☉ (red supergiants such as Stephenson 2-18; from memory)' },
    warnBelow: { si: 0.005 * R_SUN, words: '≥ 0.005 R☉', why: 'smaller than any white dwarf, the smallest about 0.005 R☉ (from memory)' },
    warnAbove: { si: 2000 * R_SUN, words: '≤ 2000 R☉', why: 'larger than the largest known stars, about 2000 R☉ (from memory)' },
  },
  luminosity: {
    refuseBelow: { si: 1e-10 * L_SUN, words: '≥ 10⁻¹⁰ L☉', why: 'a thousand times fainter than the faintest known brown dwarfs, about 10⁻⁷ L☉ (from memory)' },
    refuseAbove: { si: 1e9 * L_SUN, words: '≤ 10⁹ L☉', why: 'the light of a small galaxy, a hundred times the most luminous known stars, about 10⁷ L☉ (R136a1; from memory)' },
    warnAbove: { si: 1e7 * L_SUN, words: '≤ 10⁷ L☉', why: 'brighter than the most luminous known stars, about 10⁷ L☉ (R136a1; from memory)' },
  },
});

/**
 * Checks a derived value in SI against PHYSICAL_LIMITS. Throws
 * PhysicsError('unphysical') naming the limit when the value breaks physics
 * or lies far outside any star; returns an `implausible` warning naming the
 * limit when it lies merely outside the known stars; otherwise nothing.
 * @see PHYSICAL_LIMITS for each limit's source
 */
export function physicalLimitWarnings(quantity: QuantityId, valueSi: number): PhysicsWarning[] {
  const limits = PHYSICAL_LIMITS[quantity];
  if (!limits) return [];
  const x = limits.magnitude ? Math.abs(valueSi) : valueSi;
  const refused = (limits.refuseAbove && x >= limits.refuseAbove.si ? limits.refuseAbove : undefined) ?? (limits.refuseBelow && x < limits.refuseBelow.si ? limits.refuseBelow : undefined);
  if (refused) {
    throw new PhysicsError('unphysical', quantity, `${quantity} = ${valueSi.toPrecision(3)} ${QUANTITY_SI_UNIT[quantity]} is refused: ${refused.why}`, refused.words);
  }
  const warned = (limits.warnAbove && x > limits.warnAbove.si ? limits.warnAbove : undefined) ?? (limits.warnBelow && x < limits.warnBelow.si ? limits.warnBelow : undefined);
  if (!warned) return [];
  return [{ code: 'implausible', quantity, message: `${quantity} = ${valueSi.toPrecision(3)} ${QUANTITY_SI_UNIT[quantity]} is implausible: ${warned.why}`, limit: warned.words }];
}
