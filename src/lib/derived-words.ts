import type { DerivedStatus, DerivedValue } from '@shared/schemas/derived';
import { formatResult, QUANTITY_NAMES, spectralClassRange } from '@shared/physics/display';
import type { QuantityId } from '@shared/physics/quantities';

/*
 * How pages print a derived value: the target sheet and the review queue
 * show the same revision and must say it in the same words and units, so
 * both read the conversion from here rather than each from its own copy.
 */

export const DERIVED_STATUS_WORDS: Readonly<Record<DerivedStatus, string>> = {
  proposed: 'Proposed',
  approved: 'Approved',
  rejected: 'Rejected',
  superseded: 'Superseded',
};

export const isKnownQuantity = (q: string): q is QuantityId => Object.prototype.hasOwnProperty.call(QUANTITY_NAMES, q);

/** A derived quantity's name as the trade says it, or its id when the display does not know it. */
export function quantityName(quantity: string): string {
  return isKnownQuantity(quantity) ? QUANTITY_NAMES[quantity] : quantity;
}

/** The same name starting in lower case, for use inside a sentence ("also approves: bolometric flux r2"). */
export function quantityNameInText(quantity: string): string {
  return quantityName(quantity).replace(/^./, (c) => c.toLowerCase());
}

const displayable = (d: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty'>): d is typeof d & { quantity: QuantityId } =>
  isKnownQuantity(d.quantity) && Number.isFinite(d.value) && Number.isFinite(d.uncertainty) && d.uncertainty >= 0;

/**
 * The value in astronomers' units (one text per display unit), or the stored
 * SI figures when the quantity is not one the display knows. A non-detection
 * (an `upper_limit` warning) reads as its limit first; an asymmetric 68 %
 * interval prints as +a/−b ("98 +86/−32 pc") in place of ±σ: "< 0.46 km s⁻¹ (1σ), not detected (0.0 ± 0.5 km s⁻¹)".
 */
export function derivedValueTexts(
  d: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label'> & { warnings?: DerivedValue['warnings']; interval?: DerivedValue['interval'] },
): string[] {
  if (!displayable(d)) return [`${d.value} ± ${d.uncertainty} ${d.unit}`];
  const line = formatResult({ quantity: d.quantity, value: d.value, uncertainty: d.uncertainty, label: d.label ?? undefined, interval: d.interval ?? undefined });
  const texts = line.values.map((v) => v.text);
  const upperLimit = d.warnings?.find((w) => w.code === 'upper_limit' && w.limit)?.limit;
  if (upperLimit) return texts.map((t) => `${upperLimit}, not detected (${t})`);
  return d.quantity === 'luminosity_class' && line.label ? [`${line.label}: ${texts[0]}`] : texts;
}

/** σ alone in the first display unit, split so two of them can share one unit ("120", "K"). */
function sigmaParts(d: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label'>): { sigma: string; unit: string } {
  if (!displayable(d)) return { sigma: String(d.uncertainty), unit: d.unit };
  const first = formatResult({ quantity: d.quantity, value: d.value, uncertainty: d.uncertainty, label: d.label ?? undefined }).values[0];
  const sigma = first.uncertainty ?? '0';
  const scale = first.exponent === null ? '' : ` × 10${superscriptExponent(first.exponent)}`;
  return { sigma: `${sigma}${scale}`, unit: first.unit };
}

const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';
function superscriptExponent(n: number): string {
  return String(n)
    .split('')
    .map((ch) => (ch === '-' ? '⁻' : SUPERSCRIPT_DIGITS[Number(ch)]))
    .join('');
}

/**
 * How σ changes from one revision to the next, as printed on the value
 * lines: "σ 120 → 95 K", or with both units when they differ.
 */
export function sigmaChangeText(
  from: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label'>,
  to: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label'>,
): string {
  // A spectral class's σ is a range of types, not a fraction of a subclass.
  if (from.quantity === 'spectral_class' && to.quantity === 'spectral_class') {
    return `1σ range ${spectralClassRange(from.value, from.uncertainty)} → ${spectralClassRange(to.value, to.uncertainty)}`;
  }
  const a = sigmaParts(from);
  const b = sigmaParts(to);
  const unit = (u: string) => (u ? ` ${u}` : '');
  if (a.unit === b.unit && !a.sigma.includes('×') && !b.sigma.includes('×')) return `σ ${a.sigma} → ${b.sigma}${unit(b.unit)}`;
  return `σ ${a.sigma}${unit(a.unit)} → ${b.sigma}${unit(b.unit)}`;
}
