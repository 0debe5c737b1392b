import { airToVacuumM } from '@shared/physics/air-vacuum';
import type { DeriveOptions, MeasurementInput } from '@shared/physics/derive';
import { PhysicsError } from '@shared/physics/errors';
import type { LuminosityClassName } from '@shared/physics/main-sequence';
import { STRONG_LINES } from '@shared/physics/tables/strong-lines';
import { ALLOWED_UNITS, toSi } from '@shared/physics/units';

/**
 * The calculator's form as typed, and its translation into the engine's
 * measurements (SI) and options. Pure, so the mapping is tested without a
 * browser.
 */

export type WavelengthUnit = 'nm' | 'angstrom' | 'um';
export type FluxUnit = 'W/m2' | 'erg/s/cm2';
export type Medium = 'air' | 'vacuum';
/** Units of a distance or a luminosity known from elsewhere: those a file may give (ALLOWED_UNITS). */
export type DistanceUnit = (typeof ALLOWED_UNITS.distance)[number];
export type LuminosityUnit = (typeof ALLOWED_UNITS.luminosity)[number];

export interface ValueEntry {
  value: string;
  sigma: string;
}

/** A rest wavelength: a line of the pick-list (air) or a typed one. */
export interface RestEntry {
  /** A STRONG_LINES id, or "other" for a typed value. */
  line: string;
  custom: string;
}

export interface CalculatorForm {
  peak: ValueEntry & { unit: WavelengthUnit };
  planck: ValueEntry;
  bv: ValueEntry;
  ebv: ValueEntry;
  v: ValueEntry;
  flux: ValueEntry & { unit: FluxUnit };
  parallax: ValueEntry;
  /** A distance known from elsewhere (a cluster's, a catalogue's): used where there is no parallax. */
  distance: ValueEntry & { unit: DistanceUnit };
  /** A luminosity known from elsewhere (a standard candle's): used in place of the derived one. */
  luminosity: ValueEntry & { unit: LuminosityUnit };
  line: ValueEntry & { unit: WavelengthUnit; rest: RestEntry; medium: Medium };
  limb: ValueEntry & { unit: WavelengthUnit; rest: RestEntry };
  zeeman: ValueEntry & { unit: WavelengthUnit; rest: RestEntry; landeG: string };
  assumedClass: LuminosityClassName;
  rV: string;
}

export type FieldId = 'peak' | 'planck' | 'bv' | 'ebv' | 'v' | 'flux' | 'parallax' | 'distance' | 'luminosity' | 'line' | 'limb' | 'zeeman' | 'rV';

const empty = (): ValueEntry => ({ value: '', sigma: '' });

/** An empty form: Hα offered for the lines, main sequence assumed, R_V = 3.1. */
export function emptyForm(): CalculatorForm {
  return {
    peak: { ...empty(), unit: 'nm' },
    planck: empty(),
    bv: empty(),
    ebv: empty(),
    v: empty(),
    flux: { ...empty(), unit: 'W/m2' },
    parallax: empty(),
    distance: { ...empty(), unit: 'pc' },
    luminosity: { ...empty(), unit: 'L_sun' },
    line: { ...empty(), unit: 'nm', rest: { line: 'h_alpha', custom: '' }, medium: 'air' },
    limb: { ...empty(), unit: 'nm', rest: { line: 'h_alpha', custom: '' } },
    zeeman: { ...empty(), unit: 'angstrom', rest: { line: 'other', custom: '' }, landeG: '' },
    assumedClass: 'main_sequence',
    rV: '3.1',
  };
}

/** Reasons a typed number is refused, before the engine sees it. */
export type ParseProblem = 'not_a_number' | 'decimal_comma';

/** Reads a typed number: decimal point, optional exponent, "−" read as "-". Empty → null. */
export function parseNumber(text: string): number | null | ParseProblem {
  const t = text.trim().replace(/\u2212/g, '-');
  if (t === '') return null;
  if (/^[+-]?\d+,\d+$/.test(t)) return 'decimal_comma';
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return 'not_a_number';
  return Number(t);
}

export const PARSE_WORDING: Readonly<Record<ParseProblem, string>> = Object.freeze({
  not_a_number: 'Enter a number, such as 486.1 or 2.5e-9.',
  decimal_comma: 'Use a decimal point, not a comma.',
});

/** A typed value and σ read in one go; errors name the field. */
interface Read {
  value: number;
  sigma: number;
}

export interface CalculatorInputs {
  measurements: MeasurementInput[];
  options: DeriveOptions;
  /** Problems with what was typed, by field; such a field is left out. */
  fieldErrors: Partial<Record<FieldId, string>>;
}

/** Rest wavelength in m for a rest entry, in the medium asked for; null when none is given. */
export function restWavelengthM(rest: RestEntry, unit: WavelengthUnit, medium: Medium): number | null | ParseProblem {
  if (rest.line !== 'other') {
    const line = STRONG_LINES.find((l) => l.id === rest.line);
    if (!line) return null;
    return medium === 'vacuum' ? airToVacuumM(line.restWavelengthAirM) : line.restWavelengthAirM;
  }
  const typed = parseNumber(rest.custom);
  if (typed === null || typeof typed === 'string') return typed;
  return toSi(typed, unit);
}

/**
 * Turns the form into engine measurements in SI. Fields left empty are not
 * measurements; a value without σ travels with σ = 0 and the engine says so.
 * Signs and ranges are left to the engine, which reports them as issues
 * against the field's id.
 */
export function readForm(form: CalculatorForm): CalculatorInputs {
  const measurements: MeasurementInput[] = [];
  const fieldErrors: Partial<Record<FieldId, string>> = {};

  const read = (id: FieldId, entry: ValueEntry): Read | null => {
    const value = parseNumber(entry.value);
    const sigma = parseNumber(entry.sigma);
    if (typeof value === 'string') {
      fieldErrors[id] = PARSE_WORDING[value];
      return null;
    }
    if (typeof sigma === 'string') {
      fieldErrors[id] = `Uncertainty: ${PARSE_WORDING[sigma]}`;
      return null;
    }
    if (value === null) {
      if (sigma !== null) fieldErrors[id] = 'Enter the value as well as its uncertainty.';
      return null;
    }
    return { value, sigma: sigma ?? 0 };
  };

  const peak = read('peak', form.peak);
  if (peak) {
    measurements.push({ id: 'peak', kind: 'peak_wavelength', valueSi: toSi(peak.value, form.peak.unit), uncertaintySi: toSi(peak.sigma, form.peak.unit) });
  }
  const planck = read('planck', form.planck);
  if (planck) measurements.push({ id: 'planck', kind: 'planck_temperature', valueSi: planck.value, uncertaintySi: planck.sigma });
  const bv = read('bv', form.bv);
  if (bv) measurements.push({ id: 'bv', kind: 'colour_index', band: 'B-V', valueSi: bv.value, uncertaintySi: bv.sigma });
  const ebv = read('ebv', form.ebv);
  if (ebv) measurements.push({ id: 'ebv', kind: 'extinction', valueSi: ebv.value, uncertaintySi: ebv.sigma });
  const v = read('v', form.v);
  if (v) measurements.push({ id: 'v', kind: 'magnitude', band: 'V', valueSi: v.value, uncertaintySi: v.sigma });
  const flux = read('flux', form.flux);
  if (flux) {
    measurements.push({ id: 'flux', kind: 'bolometric_flux', valueSi: toSi(flux.value, form.flux.unit), uncertaintySi: toSi(flux.sigma, form.flux.unit) });
  }
  const parallax = read('parallax', form.parallax);
  if (parallax) {
    measurements.push({ id: 'parallax', kind: 'parallax', valueSi: toSi(parallax.value, 'mas'), uncertaintySi: toSi(parallax.sigma, 'mas') });
  }
  const distance = read('distance', form.distance);
  if (distance) {
    measurements.push({ id: 'distance', kind: 'distance', valueSi: toSi(distance.value, form.distance.unit), uncertaintySi: toSi(distance.sigma, form.distance.unit) });
  }
  const luminosity = read('luminosity', form.luminosity);
  if (luminosity) {
    measurements.push({ id: 'luminosity', kind: 'luminosity', valueSi: toSi(luminosity.value, form.luminosity.unit), uncertaintySi: toSi(luminosity.sigma, form.luminosity.unit) });
  }

  const lineGroup = (
    id: 'line' | 'limb' | 'zeeman',
    kind: 'line_wavelength' | 'limb_separation' | 'zeeman_separation',
    entry: ValueEntry & { unit: WavelengthUnit; rest: RestEntry },
    medium: Medium,
    extra: Partial<MeasurementInput> = {},
  ): void => {
    const reading = read(id, entry);
    if (!reading) return;
    let rest: number | null | ParseProblem;
    try {
      rest = restWavelengthM(entry.rest, entry.unit, medium);
    } catch (error) {
      if (!(error instanceof PhysicsError)) throw error;
      fieldErrors[id] = `Rest wavelength: ${error.message}.`;
      return;
    }
    if (typeof rest === 'string') {
      fieldErrors[id] = `Rest wavelength: ${PARSE_WORDING[rest]}`;
      return;
    }
    if (rest === null) {
      fieldErrors[id] = 'Choose a line or type its rest wavelength.';
      return;
    }
    measurements.push({
      id,
      kind,
      valueSi: toSi(reading.value, entry.unit),
      uncertaintySi: toSi(reading.sigma, entry.unit),
      restWavelengthSi: rest,
      medium,
      ...extra,
    });
  };
  lineGroup('line', 'line_wavelength', form.line, form.line.medium);
  lineGroup('limb', 'limb_separation', form.limb, 'air');
  const g = parseNumber(form.zeeman.landeG);
  if (typeof g === 'string') fieldErrors.zeeman = `Landé g: ${PARSE_WORDING[g]}`;
  else if (g === null && form.zeeman.value.trim() !== '') fieldErrors.zeeman = 'Enter the line’s Landé g.';
  else if (g !== null) lineGroup('zeeman', 'zeeman_separation', form.zeeman, 'air', { landeG: g });

  const options: DeriveOptions = { assumedClass: form.assumedClass };
  const rV = parseNumber(form.rV);
  if (typeof rV === 'string') fieldErrors.rV = PARSE_WORDING[rV];
  else if (rV !== null && !(rV > 0)) fieldErrors.rV = 'R_V must be greater than zero.';
  else if (rV !== null) options.rV = rV;

  return { measurements, options, fieldErrors };
}
