import type { QuantityId } from '@shared/physics/quantities';

/** Derived quantities shown together under a title, with a caution that holds for all of them. */
export interface QuantitySection {
  title: string;
  quantities: readonly QuantityId[];
  note?: string;
}

/**
 * How pages group the derived quantities, as an astronomer reads them. The
 * calculator and the target sheet show the same groups in the same order
 * with the same cautions, so that a value is found in the same place on
 * both.
 */
export const QUANTITY_SECTIONS: readonly QuantitySection[] = [
  {
    title: 'Temperature and spectral class',
    quantities: ['temperature_wien', 'temperature_colour', 'temperature_planck', 'temperature', 'spectral_class'],
  },
  {
    title: 'Flux, distance and size',
    quantities: ['bolometric_flux', 'distance_parallax', 'luminosity', 'radius', 'absolute_bolometric_magnitude', 'luminosity_class'],
  },
  {
    title: 'Spectroscopic parallax',
    quantities: ['luminosity_hr', 'distance_photometric'],
    note: 'This route assumes a luminosity class; its distance is only as good as that assumption.',
  },
  {
    title: 'Lines',
    quantities: ['radial_velocity', 'rotation_velocity', 'magnetic_field'],
    note: 'No barycentric or gravitational-redshift correction is applied.',
  },
];

/**
 * A caution read beside one quantity wherever it is shown. The spectral
 * class's is PRODUCT.md's: a class is read from the temperature, and the
 * lines a spectrum shows follow the temperature far more than the star's make-up.
 */
export const QUANTITY_NOTES: Readonly<Partial<Record<QuantityId, string>>> = {
  spectral_class:
    'A line’s absence from a spectrum does not mean the element is absent: hot stars ionise hydrogen, cool stars keep it in the ground state. Temperature, not composition, drives most differences between stellar spectra.',
};
