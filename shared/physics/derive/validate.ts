import { PhysicsError, type PhysicsErrorCode } from '../errors';
import { isMeasurementKind, MEASUREMENT_SI_UNIT, type MeasurementKind } from '../quantities';
import type { QuantityId } from '../quantities';
import { DERIVATION_NODES } from './nodes';
import { MUST_BE_POSITIVE, MUST_NOT_BE_NEGATIVE, NEEDS_BAND, NEEDS_REST_WAVELENGTH } from '../measurement-rules';
import type { DerivationIssue, MeasurementId, MeasurementInput } from './types';

/** A measurement that passed the checks, with its defaults filled in. */
export interface ValidMeasurement {
  readonly id: MeasurementId;
  readonly kind: MeasurementKind;
  readonly value: number;
  readonly sigma: number;
  /** Normalised band: "V", "B", "B-V" (spaces removed, "−" read as "-"). */
  readonly band?: string;
  readonly restWavelength: number;
  readonly restWavelengthSigma: number;
  readonly landeG: number;
  readonly medium: 'air' | 'vacuum';
  readonly spectrumId?: MeasurementId;
}

/**
 * The quantity a refused measurement of each kind would have fed first: the
 * first node of the derivation table that reads the kind.
 * @see DERIVATION_NODES
 */
function firstQuantity(kind: MeasurementKind): QuantityId | null {
  return DERIVATION_NODES.find((node) => node.kinds.includes(kind))?.quantity ?? null;
}

/** Whitespace or the true minus sign: what normaliseBand changes. */
const BAND_NOISE = /[\s\u2212]/;

function normaliseBand(band: unknown): string | undefined {
  if (typeof band !== 'string') return undefined;
  // Bands as the sheets give them ("V", "B-V") need no rewriting; one test spares two replacements per measurement.
  const b = BAND_NOISE.test(band) ? band.replace(/\s+/g, '').replace(/\u2212/g, '-') : band;
  return b === '' ? undefined : b;
}

function refuse(code: PhysicsErrorCode, quantity: string, message: string, limit?: string): never {
  throw new PhysicsError(code, quantity, message, limit);
}

function isFiniteNumber(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

function check(m: MeasurementInput): ValidMeasurement {
  if (!isMeasurementKind(m.kind)) refuse('unknown_kind', 'quantity', `unknown measurement quantity "${String(m.kind)}"`);
  const kind = m.kind;
  const unit = MEASUREMENT_SI_UNIT[kind];
  if (!isFiniteNumber(m.valueSi)) refuse('not_finite', kind, `${kind} value must be a finite number (got ${String(m.valueSi)})`, 'finite');
  const sigma = m.uncertaintySi ?? 0;
  if (!isFiniteNumber(sigma)) refuse('not_finite', kind, `${kind} uncertainty must be a finite number (got ${String(sigma)})`, 'finite');
  if (sigma < 0) refuse('negative_uncertainty', kind, `${kind} uncertainty must be ≥ 0 (got ${sigma} ${unit})`, '≥ 0');
  if (MUST_BE_POSITIVE.has(kind) && m.valueSi <= 0) refuse('non_positive', kind, `${kind} must be greater than 0 (got ${m.valueSi} ${unit})`, '> 0');
  if (MUST_NOT_BE_NEGATIVE.has(kind) && m.valueSi < 0) refuse('negative', kind, `${kind} must be 0 or more (got ${m.valueSi} ${unit})`, '≥ 0');
  const band = normaliseBand(m.band);
  if (NEEDS_BAND.has(kind) && band === undefined) {
    refuse('missing_input', kind, `${kind} needs its band (e.g. ${kind === 'magnitude' ? 'V' : 'B-V'})`);
  }
  let restWavelength = 0;
  let restWavelengthSigma = 0;
  if (NEEDS_REST_WAVELENGTH.has(kind)) {
    restWavelength = m.restWavelengthSi as number;
    if (m.restWavelengthSi === undefined) refuse('missing_input', 'rest_wavelength', `${kind} needs the line's rest wavelength`);
    if (!isFiniteNumber(restWavelength)) refuse('not_finite', 'rest_wavelength', `rest wavelength must be a finite number (got ${String(restWavelength)})`, 'finite');
    if (restWavelength <= 0) refuse('non_positive', 'rest_wavelength', `rest wavelength must be greater than 0 (got ${restWavelength} m)`, '> 0');
    restWavelengthSigma = m.restWavelengthUncertaintySi ?? 0;
    if (!isFiniteNumber(restWavelengthSigma)) refuse('not_finite', 'rest_wavelength', 'rest wavelength uncertainty must be a finite number', 'finite');
    if (restWavelengthSigma < 0) refuse('negative_uncertainty', 'rest_wavelength', `rest wavelength uncertainty must be ≥ 0 (got ${restWavelengthSigma} m)`, '≥ 0');
  }
  let landeG = 0;
  if (kind === 'zeeman_separation') {
    if (m.landeG === undefined) refuse('missing_input', 'lande_g', 'zeeman_separation needs the line\'s Landé g');
    landeG = m.landeG;
    if (!isFiniteNumber(landeG)) refuse('not_finite', 'lande_g', `Landé g must be a finite number (got ${String(landeG)})`, 'finite');
    if (landeG === 0) refuse('out_of_range', 'lande_g', 'a line with Landé g = 0 does not split', 'g ≠ 0');
  }
  const medium = m.medium ?? 'air';
  if (medium !== 'air' && medium !== 'vacuum') refuse('unknown_unit', 'medium', `wavelength medium must be "air" or "vacuum" (got "${String(medium)}")`);
  const valid: ValidMeasurement = band === undefined
    ? { id: m.id, kind, value: m.valueSi, sigma, restWavelength, restWavelengthSigma, landeG, medium }
    : { id: m.id, kind, value: m.valueSi, sigma, restWavelength, restWavelengthSigma, landeG, medium, band };
  const spectrumId = m.spectrumId;
  return typeof spectrumId === 'string' || (typeof spectrumId === 'number' && Number.isFinite(spectrumId)) ? { ...valid, spectrumId } : valid;
}

/**
 * Splits measurements into usable ones and issues; never throws. An issue
 * names the measurement, the quantity it would have fed, the code and the limit.
 * @see PRODUCT.md "Derivations" and "The measurement file"
 */
export function validateMeasurements(measurements: readonly MeasurementInput[]): { valid: ValidMeasurement[]; issues: DerivationIssue[] } {
  const valid: ValidMeasurement[] = [];
  const issues: DerivationIssue[] = [];
  for (const m of Array.isArray(measurements) ? measurements : []) {
    try {
      if (m === null || typeof m !== 'object') refuse('missing_input', 'measurement', 'a measurement must be an object');
      valid.push(check(m));
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      const raw = (m !== null && typeof m === 'object' ? m : null) as Partial<MeasurementInput> | null;
      const kind: MeasurementKind | null = raw && isMeasurementKind(raw.kind) ? raw.kind : null;
      const issue: DerivationIssue = {
        quantity: kind ? firstQuantity(kind) : null,
        code: error.code,
        message: `measurement ${String(raw ? raw.id : m)} refused: ${error.message}`,
      };
      if (raw && raw.id !== undefined) issue.measurementId = raw.id;
      if (error.limit !== undefined) issue.limit = error.limit;
      issues.push(issue);
    }
  }
  return { valid, issues };
}
