import { CONSTANTS } from './constants';
import { DISAGREEMENT_SIGMA } from './derive/combine';
import { labelNamesClass, radiusPlausibilityWarnings } from './luminosity-class';
import { LUMINOSITY_CLASSES, type LuminosityClassName } from './main-sequence';
import { readableMessage } from './display';

/**
 * The target sheet's cross-checks: where two routes to the same quantity, or
 * a value and the class it implies, can be set side by side, say in plain
 * words whether they agree. The σ distance is the one the engine's own
 * disagreement warnings use, so the sheet and the warnings never contradict.
 */

/** The parts of a derived value a cross-check reads. */
export interface CheckedValue {
  readonly quantity: string;
  readonly value: number;
  readonly uncertainty: number;
  readonly label?: string | null;
  readonly warnings?: readonly { readonly code: string; readonly quantity: string; readonly message: string }[];
}

export type CrossCheckVerdict = 'agree' | 'differ' | 'disagree' | 'note';

export interface CrossCheck {
  /** Stable id, for tests and keys. */
  readonly id: string;
  /** agree: within 1σ; differ: between 1σ and the engine's limit; disagree: beyond it or outside a class's range; note: an engine warning repeated. */
  readonly verdict: CrossCheckVerdict;
  readonly text: string;
  /** The σ distance, when the check is one. */
  readonly sigmaApart?: number;
}

/**
 * How many combined standard deviations two independent estimates lie apart:
 * |a − b| / √(σa² + σb²). Null when neither has a σ (the distance is then undefined).
 * @see Bevington & Robinson, Data Reduction and Error Analysis (3rd ed.), §3.2, the variance of a difference (from memory)
 */
export function sigmaApart(a: { value: number; uncertainty: number }, b: { value: number; uncertainty: number }): number | null {
  const combined = Math.hypot(a.uncertainty, b.uncertainty);
  if (!(combined > 0) || !Number.isFinite(a.value) || !Number.isFinite(b.value)) return null;
  return Math.abs(a.value - b.value) / combined;
}

/** Pairs of independent routes to one quantity, with the words for them. */
const PAIRS: readonly { a: string; b: string; words: string }[] = [
  { a: 'distance_parallax', b: 'distance_photometric', words: 'the parallax and photometric distances' },
  { a: 'temperature_wien', b: 'temperature_planck', words: 'the Wien and Planck temperatures' },
  { a: 'temperature_wien', b: 'temperature_colour', words: 'the Wien and colour temperatures' },
  { a: 'temperature_colour', b: 'temperature_planck', words: 'the colour and Planck temperatures' },
];

/** A σ distance in words: agreement within 1σ, else the distance to one decimal and whether the engine calls it a disagreement. */
function pairCheck(id: string, words: string, apart: number): CrossCheck {
  // The verdict follows the figure printed, so "1.0 σ" never reads as a difference; past the engine's limit a second decimal keeps "3.0 σ" from reading as within it.
  const rounded = Math.round(apart * 10) / 10;
  const shown = apart > DISAGREEMENT_SIGMA && rounded <= DISAGREEMENT_SIGMA ? apart.toFixed(2) : apart.toFixed(1);
  if (rounded <= 1) return { id, verdict: 'agree', text: `${capital(words)} agree within 1 σ (${shown} σ apart).`, sigmaApart: apart };
  if (!(apart > DISAGREEMENT_SIGMA))
    return { id, verdict: 'differ', text: `${capital(words)} differ by ${shown} σ, within the ${DISAGREEMENT_SIGMA} σ the engine accepts.`, sigmaApart: apart };
  return { id, verdict: 'disagree', text: `${capital(words)} differ by ${shown} σ, more than the ${DISAGREEMENT_SIGMA} σ the engine accepts.`, sigmaApart: apart };
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

const CLASS_NOUN: Readonly<Record<LuminosityClassName, string>> = {
  main_sequence: 'a main-sequence star',
  subgiant: 'a subgiant',
  giant: 'a giant',
  supergiant: 'a supergiant',
  white_dwarf: 'a white dwarf',
};

/** 3 significant figures, as the engine's own radius warning prints it. */
const rsun = (radiusM: number) => `${Number((radiusM / CONSTANTS.R_sun.value).toPrecision(3))}`;

/**
 * Does the radius fit the luminosity class found for the star? Checked only
 * when the class is settled (one class named), against the same ranges the
 * engine warns with (radiusPlausibilityWarnings).
 */
function radiusCheck(radius: CheckedValue, cls: CheckedValue, temperature: CheckedValue): CrossCheck | null {
  if (!cls.label) return null;
  const named = LUMINOSITY_CLASSES.filter((c) => labelNamesClass(cls.label ?? '', c));
  if (named.length !== 1) return null;
  const [className] = named;
  const warned = radiusPlausibilityWarnings(radius.value, temperature.value, className);
  const what = `A radius of ${rsun(radius.value)} R☉`;
  if (warned.length === 0) return { id: 'radius_class', verdict: 'agree', text: `${what} fits ${CLASS_NOUN[className]} at ${Math.round(temperature.value)} K.` };
  const range = warned[0].limit ? ` (${warned[0].limit} at ${Math.round(temperature.value)} K)` : '';
  return { id: 'radius_class', verdict: 'disagree', text: `${what} does not fit ${CLASS_NOUN[className]}${range}.` };
}

/** Engine warnings that are themselves cross-checks, repeated here in the reader's words. */
const NOTED_CODES = new Set(['measurements_disagree', 'temperatures_disagree', 'class_boundary', 'implausible', 'radius_implausible_for_class']);

/**
 * Every cross-check the values allow, in a fixed order: distances, then
 * temperatures, then radius against class, then the engine's own notes of
 * the same kind (those already said by a check above are left out).
 */
export function crossChecks(values: readonly CheckedValue[]): CrossCheck[] {
  const by = new Map(values.map((v) => [v.quantity, v]));
  const checks: CrossCheck[] = [];
  for (const { a, b, words } of PAIRS) {
    const va = by.get(a);
    const vb = by.get(b);
    if (!va || !vb) continue;
    const apart = sigmaApart(va, vb);
    if (apart !== null) checks.push(pairCheck(`${a}-${b}`, words, apart));
  }
  const radius = by.get('radius');
  const cls = by.get('luminosity_class');
  const temperature = by.get('temperature');
  const radiusVerdict = radius && cls && temperature ? radiusCheck(radius, cls, temperature) : null;
  if (radiusVerdict) checks.push(radiusVerdict);
  const seen = new Set<string>();
  for (const v of values) {
    for (const w of v.warnings ?? []) {
      if (!NOTED_CODES.has(w.code)) continue;
      if (w.code === 'radius_implausible_for_class' && radiusVerdict) continue;
      const text = capital(readableMessage(w.message));
      if (seen.has(text)) continue;
      seen.add(text);
      checks.push({ id: `${w.code}-${v.quantity}`, verdict: 'note', text: text.endsWith('.') ? text : `${text}.` });
    }
  }
  return checks;
}

/** The newest standing (approved or proposed) revision of each quantity, the one the sheet shows first and the cross-checks read. */
export function newestStanding<T extends { readonly quantity: string; readonly revision: number; readonly status: string }>(revisions: readonly T[]): T[] {
  const best = new Map<string, T>();
  for (const r of revisions) {
    if (r.status !== 'approved' && r.status !== 'proposed') continue;
    const held = best.get(r.quantity);
    if (!held || r.revision > held.revision) best.set(r.quantity, r);
  }
  return [...best.values()];
}
