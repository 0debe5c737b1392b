import type { Field } from '@shared/file-reading/measurement-file';
import type { MeasurementKind } from '@shared/physics/quantities';
import { PhysicsError } from '@shared/physics/errors';
import { parseUnit, UNITS } from '@shared/physics/units';

/*
 * How pages name the measurement file's columns and the measured quantities:
 * the upload's column mapping and the target sheet's measurement list speak
 * of the same things and must use the same words.
 */

/** A measured quantity in words, by its id in the file's quantity column. */
export const MEASUREMENT_KIND_NAMES: Readonly<Record<MeasurementKind, string>> = {
  peak_wavelength: 'Continuum peak wavelength',
  magnitude: 'Magnitude',
  colour_index: 'Colour index',
  bolometric_flux: 'Bolometric flux',
  parallax: 'Parallax',
  line_wavelength: 'Line wavelength',
  limb_separation: 'Limb-to-limb line separation',
  zeeman_separation: 'Zeeman splitting',
  extinction: 'Colour excess E(B−V)',
  distance: 'Distance (known from elsewhere)',
  luminosity: 'Luminosity (known from elsewhere)',
  planck_temperature: 'Planck-fit temperature',
};

export function measurementKindName(kind: string): string {
  return MEASUREMENT_KIND_NAMES[kind as MeasurementKind] ?? kind;
}

/** A photometric band as astronomers print it: a colour index with a true minus sign (files write B-V, the page B−V). */
export function bandName(band: string): string {
  return band.replace(/^([A-Za-z]{1,2})\s*-\s*([A-Za-z]{1,2})$/, '$1\u2212$2');
}

/** A column of the measurement file in words, with its header name, e.g. "Right ascension (ra)". */
export const FIELD_NAMES: Readonly<Record<Field, string>> = {
  target: 'Target designation',
  ra: 'Right ascension',
  dec: 'Declination',
  quantity: 'Quantity',
  value: 'Value',
  uncertainty: 'Uncertainty (1σ)',
  unit: 'Unit',
  band: 'Band',
  rest_wavelength: 'Rest wavelength',
  lande_g: 'Landé g',
  observed_at: 'Observed at (UTC)',
  instrument: 'Instrument',
  note: 'Note',
};

/** A unit name as a file writes it (nm, angstrom, W/m2, Lsun) → the symbol astronomers print (nm, Å, W m⁻², L☉). */
export function unitSymbol(unit: string | null | undefined): string {
  if (!unit) return '';
  try {
    return UNITS[parseUnit(unit)].symbol;
  } catch (error) {
    if (error instanceof PhysicsError) return unit;
    throw error;
  }
}
