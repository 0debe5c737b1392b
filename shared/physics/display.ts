import { PhysicsError } from './errors';
import type { QuantityId } from './quantities';
import { spectralTypeNearIndex } from './spectral-class';
import { fromSi, UNITS, type UnitName } from './units';

/**
 * Turns SI results into the units astronomers read (K, nm, L☉, R☉, pc and ly,
 * km/s, mag, G) with sensible significant figures. Pure; shared by the
 * calculator and the target sheet.
 *
 * Rounding: σ is kept to two significant figures when its first three digits
 * are 100–354 and to one when they are 355–949 (949–999 rounds up to 1000 and
 * keeps two); the value is rounded to the same decimal place. This is common
 * practice (the Particle Data Group's rounding rule, from memory). A value
 * without σ is shown to four significant figures.
 */

/** One number with its uncertainty, ready to print. */
export interface DisplayValue {
  /** The value, rounded, with a true minus sign and thin-space digit groups. */
  readonly value: string;
  /** The 1-sigma uncertainty, rounded; null when there is none. */
  readonly uncertainty: string | null;
  /** For a skewed Monte Carlo interval: the distances to its upper and lower ends. */
  readonly asymmetric?: { readonly plus: string; readonly minus: string };
  /** Power of ten the value and uncertainty are scaled by, when they are printed in scientific form. */
  readonly exponent: number | null;
  /** Unit symbol as astronomers write it. */
  readonly unit: string;
  /** Everything on one line, e.g. "5772 ± 12 K" or "(3.83 ± 0.02) × 10²⁶ W". */
  readonly text: string;
}

const MINUS = '\u2212';
const THIN = '\u2009';
const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

function superscript(n: number): string {
  return String(n)
    .split('')
    .map((ch) => SUPERSCRIPT[ch] ?? ch)
    .join('');
}

/** Groups the integer part in threes with thin spaces once it has five or more digits, and uses a true minus. */
function typeset(fixed: string): string {
  const negative = fixed.startsWith('-');
  const body = negative ? fixed.slice(1) : fixed;
  const [int, frac] = body.split('.');
  const grouped = int.length >= 5 ? int.replace(/\B(?=(\d{3})+(?!\d))/g, THIN) : int;
  const out = frac !== undefined ? `${grouped}.${frac}` : grouped;
  return negative && !/^[0.]+$/.test(body) ? `${MINUS}${out}` : out;
}

/**
 * Decimal place (power of ten of the last kept digit) for an uncertainty,
 * by the rounding rule above.
 */
function lastDigitPlace(sigma: number): number {
  let place = Math.floor(Math.log10(sigma));
  let leading = Math.round(sigma / 10 ** (place - 2));
  if (leading >= 1000) {
    place += 1;
    leading = Math.round(leading / 10);
  }
  return leading <= 354 ? place - 1 : place;
}

function fixedAt(x: number, place: number): string {
  const decimals = Math.max(0, -place);
  const rounded = Math.round(x / 10 ** place) * 10 ** place;
  return rounded.toFixed(decimals);
}

/**
 * Formats a value and its σ, both in `unitSymbol`'s unit, as a ledger line.
 * Values at or above 10⁶ or below 10⁻³ in magnitude are printed as
 * (mantissa ± σ) × 10ⁿ. `interval` (a Monte Carlo 68 % interval in the same
 * unit, given by the engine only where its two arms differ) is shown as +a/−b
 * unless the two print alike.
 * Throws PhysicsError for non-finite input.
 * @see Particle Data Group, rounding of uncertainties (common practice, from memory)
 */
export function formatMeasured(value: number, sigma: number, unitSymbol: string, interval?: { low: number; high: number }): DisplayValue {
  if (!Number.isFinite(value) || !Number.isFinite(sigma) || sigma < 0) {
    throw new PhysicsError('not_finite', 'display', 'only finite values with σ ≥ 0 can be displayed');
  }
  const magnitude = Math.abs(value);
  const exponent = magnitude !== 0 && (magnitude >= 1e6 || magnitude < 1e-3) ? Math.floor(Math.log10(magnitude)) : null;
  const scale = exponent === null ? 1 : 10 ** exponent;
  const v = value / scale;
  const s = sigma / scale;
  let place: number;
  if (s > 0) place = lastDigitPlace(s);
  else place = v === 0 ? 0 : Math.floor(Math.log10(Math.abs(v))) - 3;
  const valueText = typeset(fixedAt(v, place));
  const sigmaText = s > 0 ? typeset(fixedAt(s, place)) : null;
  let asymmetric: DisplayValue['asymmetric'];
  if (interval && s > 0) {
    const plus = (interval.high - value) / scale;
    const minus = (value - interval.low) / scale;
    // The engine gives an interval only where its arms differ (derive/evaluate.ts ASYMMETRY_LIMIT); it is shown unless they print alike.
    if (plus > 0 && minus > 0) {
      const p = Math.min(lastDigitPlace(plus), lastDigitPlace(minus));
      const arms = { plus: typeset(fixedAt(plus, p)), minus: typeset(fixedAt(minus, p)) };
      if (arms.plus !== arms.minus) asymmetric = arms;
    }
  }
  const spread = asymmetric ? ` +${asymmetric.plus}/${MINUS}${asymmetric.minus}` : sigmaText ? ` ± ${sigmaText}` : '';
  const unitPart = unitSymbol ? ` ${unitSymbol}` : '';
  const text =
    exponent === null
      ? `${valueText}${spread}${unitPart}`
      : `${spread ? '(' : ''}${valueText}${spread}${spread ? ')' : ''} × 10${superscript(exponent)}${unitPart}`;
  return { value: valueText, uncertainty: sigmaText, ...(asymmetric ? { asymmetric } : {}), exponent, unit: unitSymbol, text };
}

/** The display units of each derived quantity; distances are shown twice. */
export const DISPLAY_UNITS: Readonly<Record<QuantityId, readonly UnitName[]>> = Object.freeze({
  temperature_wien: ['K'],
  temperature_colour: ['K'],
  temperature_planck: ['K'],
  temperature: ['K'],
  spectral_class: ['1'],
  bolometric_flux: ['W/m2'],
  distance_parallax: ['pc', 'ly'],
  luminosity: ['L_sun'],
  radius: ['R_sun'],
  luminosity_class: ['dex'],
  luminosity_hr: ['L_sun'],
  distance_photometric: ['pc', 'ly'],
  absolute_bolometric_magnitude: ['mag'],
  radial_velocity: ['km/s'],
  rotation_velocity: ['km/s'],
  magnetic_field: ['G'],
});

/** Names of the derived quantities as the trade says them. */
export const QUANTITY_NAMES: Readonly<Record<QuantityId, string>> = Object.freeze({
  temperature_wien: 'Effective temperature (Wien)',
  temperature_colour: 'Effective temperature (colour)',
  temperature_planck: 'Effective temperature (Planck fit)',
  temperature: 'Effective temperature, adopted',
  spectral_class: 'Spectral class',
  bolometric_flux: 'Bolometric flux',
  distance_parallax: 'Distance (parallax)',
  luminosity: 'Luminosity',
  radius: 'Radius',
  luminosity_class: 'Luminosity class',
  luminosity_hr: 'Luminosity for the assumed class',
  distance_photometric: 'Distance (photometric)',
  absolute_bolometric_magnitude: 'Absolute bolometric magnitude',
  radial_velocity: 'Radial velocity',
  rotation_velocity: 'Rotation, v sin i',
  magnetic_field: 'Magnetic field',
});

/**
 * A spectral class as a spectroscopist writes it, with its uncertainty as the
 * range of types its 1σ spans: "G2, G1–G3". When that range stays inside the
 * type, "G2 (1σ inside G2)"; a class without σ is its type alone. Never
 * "± 0.0 subclass": a fraction of a subclass is finer than spectra are typed.
 * @see Morgan & Keenan's decimal subclasses (from memory); spectral-class.ts for the table
 */
export function spectralClassText(label: string, index: number, sigma: number): string {
  if (!(sigma > 0)) return label;
  const range = spectralClassRange(index, sigma);
  return range.includes('–') ? `${label}, ${range}` : `${label} (1σ inside ${range})`;
}

/** The types a spectral index's 1σ spans, "G1–G3", or the one type when it stays inside it. */
export function spectralClassRange(index: number, sigma: number): string {
  const low = spectralTypeNearIndex(index - Math.max(0, sigma));
  const high = spectralTypeNearIndex(index + Math.max(0, sigma));
  return low === high ? low : `${low}–${high}`;
}

/** The parts of a derived result the display needs. */
export interface DisplayableResult {
  readonly quantity: QuantityId;
  readonly value: number;
  readonly uncertainty: number;
  readonly label?: string;
  readonly interval?: { readonly low: number; readonly high: number };
}

/** A derived result ready to print: the category word if any, then one line per display unit. */
export interface DisplayLine {
  readonly name: string;
  readonly label: string | null;
  readonly values: readonly DisplayValue[];
}

/**
 * Converts an SI result to its display units (DISPLAY_UNITS) and formats it.
 * The spectral class prints its label with σ in subclasses; the luminosity
 * class its label with the offset from the main sequence in dex; fields of
 * 1000 G and more print in kG.
 * @see formatMeasured; units.ts for the conversions (IAU 2015 B2/B3, CODATA 2018)
 */
export function formatResult(result: DisplayableResult): DisplayLine {
  const name = QUANTITY_NAMES[result.quantity];
  if (result.quantity === 'spectral_class') {
    // Subclasses are tabulated in steps of 0.5 at best, so σ is kept to a tenth for σ's own change ("σ 0.9 → 0.5 subclass").
    const sigma = result.uncertainty.toFixed(1);
    const label = result.label ?? spectralTypeNearIndex(result.value);
    return {
      name,
      label: result.label ?? null,
      values: [{ value: label, uncertainty: sigma, exponent: null, unit: 'subclass', text: spectralClassText(label, result.value, result.uncertainty) }],
    };
  }
  if (result.quantity === 'luminosity_class') {
    const offset = formatMeasured(result.value, result.uncertainty, 'dex');
    return { name, label: result.label ?? null, values: [{ ...offset, text: `${offset.text} from the main sequence` }] };
  }
  let units = DISPLAY_UNITS[result.quantity];
  if (result.quantity === 'magnetic_field' && Math.abs(fromSi(result.value, 'G')) >= 1000) units = ['kG'];
  const values = units.map((unit) => {
    const interval = result.interval ? { low: fromSi(result.interval.low, unit), high: fromSi(result.interval.high, unit) } : undefined;
    return formatMeasured(fromSi(result.value, unit), fromSi(result.uncertainty, unit), UNITS[unit].symbol, interval);
  });
  return { name, label: result.label ?? null, values };
}

/**
 * An upper limit in SI as the sheet prints it: "< 0.46 km s⁻¹ (1σ)", in the
 * quantity's first display unit (kG for fields of 1000 G and more), to two
 * significant figures.
 * @see detection.ts (the 1σ limit of a non-detection)
 */
export function upperLimitText(quantity: QuantityId, limitSi: number): string {
  if (!Number.isFinite(limitSi)) throw new PhysicsError('not_finite', 'display', 'only a finite upper limit can be displayed');
  const unit: UnitName = quantity === 'magnetic_field' && Math.abs(fromSi(limitSi, 'G')) >= 1000 ? 'kG' : DISPLAY_UNITS[quantity][0];
  const symbol = UNITS[unit].symbol;
  return `< ${String(Number(fromSi(limitSi, unit).toPrecision(2)))}${symbol ? ` ${symbol}` : ''} (1σ)`;
}

// Only ids with an underscore: the one-word ids (temperature, luminosity,
// radius) read as ordinary words already.
const QUANTITY_ID_PATTERN = new RegExp(
  `\\b(${Object.keys(QUANTITY_NAMES)
    .filter((id) => id.includes('_'))
    .sort((a, b) => b.length - a.length)
    .join('|')})\\b`,
  'g',
);

/**
 * Replaces quantity ids in an engine message (they name the quantity for
 * machines) with the names people read, e.g. temperature_wien →
 * "effective temperature (Wien)".
 * @see QUANTITY_NAMES
 */
export function readableMessage(message: string): string {
  return message.replace(QUANTITY_ID_PATTERN, (id) => QUANTITY_NAMES[id as QuantityId].replace(/^./, (c) => c.toLowerCase()));
}
