import { CONSTANTS } from './constants';
import { PhysicsError, requireFinite, requireUncertainty } from './errors';
import { MEASUREMENT_SI_UNIT, isMeasurementKind, type MeasurementKind } from './quantities';

/**
 * Units and conversions. Every unit is a linear multiple of its SI unit, so
 * a value and its 1-sigma uncertainty convert with the same factor.
 *
 * A number crosses a module boundary either with its unit (`Quantity`), or
 * as a parameter whose name carries the unit (`wavelengthM`, `parallaxMas`).
 */

export type Dimension =
  | 'length'
  | 'flux'
  | 'angle'
  | 'luminosity'
  | 'temperature'
  | 'magnitude'
  | 'velocity'
  | 'magnetic_field'
  | 'dex'
  | 'dimensionless';

interface UnitDefinition {
  readonly dimension: Dimension;
  /** Multiply a value in this unit by `toSi` to get SI. */
  readonly toSi: number;
  readonly symbol: string;
}

const ARCSEC_RAD = Math.PI / 648_000;

/**
 * The units Starledger knows, by canonical name.
 * @see CODATA 2018 and IAU 2015 B2/B3, IAU 2012 B2 for the astronomical factors (constants/)
 */
export const UNITS = Object.freeze({
  m: { dimension: 'length', toSi: 1, symbol: 'm' },
  km: { dimension: 'length', toSi: 1e3, symbol: 'km' },
  nm: { dimension: 'length', toSi: 1e-9, symbol: 'nm' },
  angstrom: { dimension: 'length', toSi: 1e-10, symbol: 'Å' },
  um: { dimension: 'length', toSi: 1e-6, symbol: 'µm' },
  au: { dimension: 'length', toSi: CONSTANTS.au.value, symbol: 'au' },
  pc: { dimension: 'length', toSi: CONSTANTS.pc.value, symbol: 'pc' },
  kpc: { dimension: 'length', toSi: 1e3 * CONSTANTS.pc.value, symbol: 'kpc' },
  ly: { dimension: 'length', toSi: CONSTANTS.ly.value, symbol: 'ly' },
  R_sun: { dimension: 'length', toSi: CONSTANTS.R_sun.value, symbol: 'R☉' },
  'W/m2': { dimension: 'flux', toSi: 1, symbol: 'W m⁻²' },
  // 1 erg s⁻¹ cm⁻² = 1e-7 W / 1e-4 m²
  'erg/s/cm2': { dimension: 'flux', toSi: 1e-3, symbol: 'erg s⁻¹ cm⁻²' },
  rad: { dimension: 'angle', toSi: 1, symbol: 'rad' },
  deg: { dimension: 'angle', toSi: Math.PI / 180, symbol: '°' },
  arcsec: { dimension: 'angle', toSi: ARCSEC_RAD, symbol: '″' },
  mas: { dimension: 'angle', toSi: ARCSEC_RAD / 1000, symbol: 'mas' },
  W: { dimension: 'luminosity', toSi: 1, symbol: 'W' },
  L_sun: { dimension: 'luminosity', toSi: CONSTANTS.L_sun.value, symbol: 'L☉' },
  K: { dimension: 'temperature', toSi: 1, symbol: 'K' },
  mag: { dimension: 'magnitude', toSi: 1, symbol: 'mag' },
  'm/s': { dimension: 'velocity', toSi: 1, symbol: 'm s⁻¹' },
  'km/s': { dimension: 'velocity', toSi: 1e3, symbol: 'km s⁻¹' },
  T: { dimension: 'magnetic_field', toSi: 1, symbol: 'T' },
  G: { dimension: 'magnetic_field', toSi: 1e-4, symbol: 'G' },
  kG: { dimension: 'magnetic_field', toSi: 1e-1, symbol: 'kG' },
  dex: { dimension: 'dex', toSi: 1, symbol: 'dex' },
  '1': { dimension: 'dimensionless', toSi: 1, symbol: '' },
} satisfies Record<string, UnitDefinition>);

export type UnitName = keyof typeof UNITS;

/** A value that travels with its unit. */
export interface Quantity<U extends string = UnitName> {
  readonly value: number;
  readonly unit: U;
}

/**
 * Spellings accepted from files for the canonical names. Both Unicode forms
 * of Å (U+00C5, U+212B) and of µ (U+00B5 micro sign, U+03BC Greek mu) are
 * accepted because spreadsheets produce either; the solar luminosity is
 * written Lsun or L☉ (U+2609).
 */
const ALIASES: Readonly<Record<string, UnitName>> = Object.freeze({
  '\u00C5': 'angstrom',
  '\u212B': 'angstrom',
  '\u00B5m': 'um',
  '\u03BCm': 'um',
  Lsun: 'L_sun',
  'L\u2609': 'L_sun',
});

/**
 * Resolves a unit name as written in a file to its canonical name; surrounding
 * spaces are ignored, letter case is not (mas and Mas are not the same unit).
 * Throws PhysicsError('unknown_unit') for anything else.
 * @see PRODUCT.md "The measurement file" (unit names)
 */
export function parseUnit(text: string, quantity = 'unit'): UnitName {
  const trimmed = typeof text === 'string' ? text.trim() : '';
  if (Object.prototype.hasOwnProperty.call(UNITS, trimmed)) return trimmed as UnitName;
  const alias = ALIASES[trimmed];
  if (alias) return alias;
  throw new PhysicsError('unknown_unit', quantity, `unknown unit "${String(text)}" for ${quantity}`);
}

/**
 * Converts `value` in `unit` to the SI unit of its dimension (linear factor).
 * @see BIPM, The International System of Units (SI Brochure, 9th ed., 2019); IAU 2012 B2 and IAU 2015 B2/B3 for au, pc, L☉, R☉
 */
export function toSi(value: number, unit: UnitName): number {
  return value * UNITS[unit].toSi;
}

/**
 * Converts an SI value to `unit` (linear factor).
 * @see BIPM, The International System of Units (SI Brochure, 9th ed., 2019); IAU 2012 B2 and IAU 2015 B2/B3 for au, pc, L☉, R☉
 */
export function fromSi(valueSi: number, unit: UnitName): number {
  return valueSi / UNITS[unit].toSi;
}

/**
 * Converts between two units of one dimension (e.g. nm → Å, pc → ly,
 * erg s⁻¹ cm⁻² → W m⁻², mas → arcsec, W → L☉). Throws PhysicsError
 * ('unknown_unit') when the dimensions differ.
 * @see BIPM, The International System of Units (SI Brochure, 9th ed., 2019); IAU 2012 B2 and IAU 2015 B2/B3 for au, pc, L☉, R☉
 */
export function convert(value: number, from: UnitName, to: UnitName): number {
  if (UNITS[from].dimension !== UNITS[to].dimension) {
    throw new PhysicsError('unknown_unit', to, `cannot convert ${from} (${UNITS[from].dimension}) to ${to} (${UNITS[to].dimension})`);
  }
  return (value * UNITS[from].toSi) / UNITS[to].toSi;
}

/**
 * Converts a Quantity to another unit of the same dimension.
 * @see BIPM, The International System of Units (SI Brochure, 9th ed., 2019); IAU 2012 B2 and IAU 2015 B2/B3 for au, pc, L☉, R☉
 */
export function convertQuantity<U extends UnitName>(quantity: Quantity<UnitName>, to: U): Quantity<U> {
  return { value: convert(quantity.value, quantity.unit, to), unit: to };
}

/** Units a wavelength may be given in (a spectrum's wavelength column, every line and peak wavelength). */
export const WAVELENGTH_UNITS = ['nm', 'angstrom', 'um', 'm'] as const satisfies readonly UnitName[];
const MAG_UNITS = ['mag'] as const;

/**
 * Units a file may give for each measurement kind (PRODUCT.md, "The
 * measurement file"); the first is the one the upload templates use.
 * Magnitudes, colour indices and E(B−V) are in mag; an empty unit is read
 * as mag for them because the file makes the unit optional there. A file
 * writes the solar luminosity Lsun or L☉ (see ALIASES).
 */
export const ALLOWED_UNITS: Readonly<Record<MeasurementKind, readonly UnitName[]>> = Object.freeze({
  peak_wavelength: WAVELENGTH_UNITS,
  line_wavelength: WAVELENGTH_UNITS,
  limb_separation: WAVELENGTH_UNITS,
  zeeman_separation: WAVELENGTH_UNITS,
  magnitude: MAG_UNITS,
  colour_index: MAG_UNITS,
  extinction: MAG_UNITS,
  bolometric_flux: ['W/m2', 'erg/s/cm2'],
  parallax: ['mas', 'arcsec'],
  distance: ['pc', 'kpc', 'ly', 'm'],
  luminosity: ['L_sun', 'W'],
  planck_temperature: ['K'],
});

/**
 * The units a file may give for `kind`. Throws PhysicsError('unknown_kind') for an unknown kind.
 * @see PRODUCT.md "The measurement file"
 */
export function allowedUnits(kind: string): readonly UnitName[] {
  if (!isMeasurementKind(kind)) {
    throw new PhysicsError('unknown_kind', 'quantity', `unknown measurement quantity "${kind}"`);
  }
  return ALLOWED_UNITS[kind];
}

/** A measurement converted to SI. */
export interface SiMeasurement {
  valueSi: number;
  uncertaintySi: number;
  unitSi: string;
}

/**
 * Validates a file row's unit for its kind and converts value and uncertainty
 * to SI (m, W m⁻², W, rad, mag, K). The unit must be one allowed for the kind;
 * an empty unit is accepted for mag kinds. Value must be finite, uncertainty
 * finite and ≥ 0 (omitted = 0). Sign and range checks belong to the laws and
 * the engine. Throws PhysicsError with code unknown_kind, unknown_unit,
 * not_finite or negative_uncertainty; `quantity` names the kind.
 * @see PRODUCT.md "The measurement file"
 */
export function measurementToSi(kind: string, value: number, unit: string | undefined, uncertainty = 0): SiMeasurement {
  const allowed = allowedUnits(kind);
  const mk = kind as MeasurementKind;
  const given = unit === undefined ? '' : unit.trim();
  let name: UnitName;
  if (given === '' && allowed.length === 1 && allowed[0] === 'mag') {
    name = 'mag';
  } else {
    name = parseUnit(given, kind);
    if (!allowed.includes(name)) {
      throw new PhysicsError('unknown_unit', kind, `unit "${given}" is not allowed for ${kind}; use one of ${allowed.join(', ')}`);
    }
  }
  requireFinite(value, kind);
  requireUncertainty(uncertainty, kind);
  return { valueSi: toSi(value, name), uncertaintySi: toSi(uncertainty, name), unitSi: MEASUREMENT_SI_UNIT[mk] };
}
