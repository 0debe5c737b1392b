import type { MeasurementKind } from './quantities';

/**
 * What each measurement kind needs beside its value, written once: the
 * file reader (shared/file-reading/measurement-file.ts), the engine's own checks
 * (derive/validate.ts) and the column-mapping form all read these. The
 * units each kind accepts are ALLOWED_UNITS in units.ts.
 */

/** Kinds measured in a photometric band: a magnitude in one (V), a colour index between two (B-V). */
export const NEEDS_BAND: ReadonlySet<MeasurementKind> = new Set<MeasurementKind>(['magnitude', 'colour_index']);

/** Kinds measured on a spectral line: they need the line's rest wavelength, in the value's unit. */
export const NEEDS_REST_WAVELENGTH: ReadonlySet<MeasurementKind> = new Set<MeasurementKind>(['line_wavelength', 'limb_separation', 'zeeman_separation']);

/** Kinds whose value must be strictly positive (a wavelength, a flux, a parallax, a distance, a luminosity, a temperature). */
export const MUST_BE_POSITIVE: ReadonlySet<MeasurementKind> = new Set<MeasurementKind>([
  'peak_wavelength',
  'line_wavelength',
  'bolometric_flux',
  'parallax',
  'distance',
  'luminosity',
  'planck_temperature',
]);

/** Sizes for which 0 (no rotation, no field detected) is a measurement: they must not be negative. */
export const MUST_NOT_BE_NEGATIVE: ReadonlySet<MeasurementKind> = new Set<MeasurementKind>(['limb_separation', 'zeeman_separation']);
