/**
 * The names Starledger's physics speaks in: the measured quantity kinds a
 * file or pipeline may send, and the derived quantity ids of PRODUCT.md's
 * derivation table, each with the SI unit its value is stored in.
 */

/**
 * Measurement kinds. All but the last are the `quantity` column of the
 * measurement file; `planck_temperature` is recorded by the spectrum upload
 * (the temperature of the Planck fit, in K), alongside `peak_wavelength`.
 * `distance` and `luminosity` are values known from elsewhere (a cluster's
 * or a catalogue's distance, a standard candle's luminosity).
 */
export const MEASUREMENT_KINDS = [
  'peak_wavelength',
  'magnitude',
  'colour_index',
  'bolometric_flux',
  'parallax',
  'line_wavelength',
  'limb_separation',
  'zeeman_separation',
  'extinction',
  'distance',
  'luminosity',
  'planck_temperature',
] as const;

export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

/**
 * True when `kind` is one of MEASUREMENT_KINDS.
 * @see PRODUCT.md "The measurement file" (quantity column)
 */
export function isMeasurementKind(kind: unknown): kind is MeasurementKind {
  return typeof kind === 'string' && (MEASUREMENT_KINDS as readonly string[]).includes(kind);
}

/** SI unit in which each measurement kind travels once converted (`valueSi`). */
export const MEASUREMENT_SI_UNIT: Readonly<Record<MeasurementKind, string>> = Object.freeze({
  peak_wavelength: 'm',
  magnitude: 'mag',
  colour_index: 'mag',
  bolometric_flux: 'W/m2',
  parallax: 'rad',
  line_wavelength: 'm',
  limb_separation: 'm',
  zeeman_separation: 'm',
  extinction: 'mag',
  distance: 'm',
  luminosity: 'W',
  planck_temperature: 'K',
});

/** Derived quantity ids, exactly as in PRODUCT.md's derivation table. */
export const QUANTITY_IDS = [
  'temperature_wien',
  'temperature_colour',
  'temperature_planck',
  'temperature',
  'spectral_class',
  'bolometric_flux',
  'distance_parallax',
  'luminosity',
  'radius',
  'luminosity_class',
  'luminosity_hr',
  'distance_photometric',
  'absolute_bolometric_magnitude',
  'radial_velocity',
  'rotation_velocity',
  'magnetic_field',
] as const;

export type QuantityId = (typeof QUANTITY_IDS)[number];

/**
 * SI unit of each derived quantity's stored value. `spectral_class` is a
 * continuous index (O0 = 0, B0 = 10, … M0 = 60, so G2 = 42) carried with a
 * label such as "G2"; `luminosity_class` is the offset from the main
 * sequence, log10(L / L_MS(T)) in dex, carried with the class as a label.
 */
export const QUANTITY_SI_UNIT: Readonly<Record<QuantityId, string>> = Object.freeze({
  temperature_wien: 'K',
  temperature_colour: 'K',
  temperature_planck: 'K',
  temperature: 'K',
  spectral_class: '1',
  bolometric_flux: 'W/m2',
  distance_parallax: 'm',
  luminosity: 'W',
  radius: 'm',
  luminosity_class: 'dex',
  luminosity_hr: 'W',
  distance_photometric: 'm',
  absolute_bolometric_magnitude: 'mag',
  radial_velocity: 'm/s',
  rotation_velocity: 'm/s',
  magnetic_field: 'T',
});
