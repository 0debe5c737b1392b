import { describe, expect, it } from 'vitest';
import { PhysicsError } from '@shared/physics/errors';
import { MEASUREMENT_KINDS } from '@shared/physics/quantities';
import { readMeasurementRecords, suggestMapping } from '@shared/file-reading/measurement-file';
import { allowedUnits, convert, convertQuantity, measurementToSi, parseUnit, toSi } from '@shared/physics/units';

describe('units', () => {
  it('wavelength: 1 Å = 0.1 nm = 1e-4 µm = 1e-10 m (SI prefixes; the ångström as defined, 1e-10 m)', () => {
    expect(convert(1, 'angstrom', 'nm')).toBeCloseTo(0.1, 15);
    expect(convert(1, 'angstrom', 'um')).toBeCloseTo(1e-4, 18);
    expect(toSi(500, 'nm')).toBeCloseTo(5e-7, 20);
  });

  it('flux: 1 erg s⁻¹ cm⁻² = 1e-3 W m⁻² (1 erg = 1e-7 J, CGS definition)', () => {
    expect(convert(1, 'erg/s/cm2', 'W/m2')).toBeCloseTo(1e-3, 18);
  });

  it('angle: 1 arcsec = 1000 mas = 1/3600 degree (definition of the arcsecond)', () => {
    expect(convert(1, 'arcsec', 'mas')).toBeCloseTo(1000, 9);
    expect(convert(3600, 'arcsec', 'deg')).toBeCloseTo(1, 12);
  });

  it('distance: 1 pc = 206 264.806 au and 3.261 563 777 ly (IAU 2015 B2 pc, IAU Julian-year ly)', () => {
    expect(convert(1, 'pc', 'au')).toBeCloseTo(206_264.806_247, 5);
    expect(convert(1, 'pc', 'ly')).toBeCloseTo(3.261_563_777, 8);
  });

  it('a value keeps its unit through a conversion: 10 pc is 32.6156 ly (IAU 2015 B2 pc, Julian-year ly)', () => {
    const d = convertQuantity({ value: 10, unit: 'pc' }, 'ly');
    expect(d.unit).toBe('ly');
    expect(d.value).toBeCloseTo(32.615_637_77, 7);
  });

  it('solar units: L☉ and R☉ are the IAU 2015 B3 nominal values', () => {
    expect(toSi(1, 'L_sun')).toBe(3.828e26);
    expect(toSi(1, 'R_sun')).toBe(6.957e8);
  });

  it('refuses conversion between dimensions and unknown units with a typed error', () => {
    expect(() => convert(1, 'nm', 'mas')).toThrow(PhysicsError);
    expect(() => parseUnit('furlong')).toThrow(PhysicsError);
    try {
      parseUnit('parsecs', 'parallax');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(PhysicsError);
      expect((e as PhysicsError).code).toBe('unknown_unit');
      expect((e as PhysicsError).quantity).toBe('parallax');
    }
  });

  it('accepts the file unit names of PRODUCT.md, both Unicode Å and both µ', () => {
    expect(parseUnit('angstrom')).toBe('angstrom');
    expect(parseUnit('\u00C5')).toBe('angstrom');
    expect(parseUnit('\u212B')).toBe('angstrom');
    expect(parseUnit('um')).toBe('um');
    expect(parseUnit('\u00B5m')).toBe('um');
    expect(parseUnit('\u03BCm')).toBe('um');
    expect(parseUnit(' mas ')).toBe('mas');
  });

  it('says which units each measurement kind allows', () => {
    for (const kind of MEASUREMENT_KINDS) expect(allowedUnits(kind).length).toBeGreaterThan(0);
    expect(allowedUnits('parallax')).toEqual(['mas', 'arcsec']);
    expect(allowedUnits('bolometric_flux')).toEqual(['W/m2', 'erg/s/cm2']);
    expect(allowedUnits('peak_wavelength')).toEqual(['nm', 'angstrom', 'um', 'm']);
    expect(allowedUnits('magnitude')).toEqual(['mag']);
    expect(() => allowedUnits('temperature')).toThrow(PhysicsError);
  });

  it('converts a file row to SI and refuses a unit not allowed for its kind', () => {
    const row = measurementToSi('parallax', 10, 'mas', 0.5);
    expect(row.unitSi).toBe('rad');
    expect(row.valueSi).toBeCloseTo((10e-3 / 3600) * (Math.PI / 180), 20);
    expect(row.uncertaintySi / row.valueSi).toBeCloseTo(0.05, 12);
    expect(measurementToSi('peak_wavelength', 5000, 'Å').valueSi).toBeCloseTo(5e-7, 20);
    expect(measurementToSi('bolometric_flux', 2, 'erg/s/cm2').valueSi).toBeCloseTo(2e-3, 18);
    expect(measurementToSi('magnitude', 7.2, '').valueSi).toBe(7.2);
    expect(() => measurementToSi('parallax', 10, 'nm')).toThrow(PhysicsError);
    expect(() => measurementToSi('peak_wavelength', 500, 'mas')).toThrow(PhysicsError);
    expect(() => measurementToSi('peak_wavelength', 500, '')).toThrow(PhysicsError);
    expect(() => measurementToSi('peak_wavelength', Number.NaN, 'nm')).toThrow(PhysicsError);
    expect(() => measurementToSi('peak_wavelength', 500, 'nm', -1)).toThrow(PhysicsError);
    expect(() => measurementToSi('colour', 0.5, 'mag')).toThrow(PhysicsError);
  });
});

describe('the measurement file accepts a measured zero', () => {
  const headers = ['target', 'quantity', 'value', 'uncertainty', 'unit', 'rest_wavelength', 'lande_g'];
  const read = (records: string[][]) => readMeasurementRecords(headers, records, suggestMapping(headers));

  it('a limb separation or Zeeman splitting of 0 ± σ (nothing detected) is read, in SI, as 0 ± σ', () => {
    const { rows, errors } = read([
      ['GW 1', 'limb_separation', '0', '0.002', 'nm', '656.279', ''],
      ['GW 1', 'zeeman_separation', '0', '1', 'angstrom', '5250.2', '3'],
    ]);
    expect(errors).toEqual([]);
    expect(rows.map((r) => [r.kind, r.valueSi])).toEqual([
      ['limb_separation', 0],
      ['zeeman_separation', 0],
    ]);
    // 0.002 nm = 2e-12 m, 1 Å = 1e-10 m (SI Brochure, 9th ed.).
    expect(rows[0].uncertaintySi).toBeCloseTo(2e-12, 24);
    expect(rows[1].uncertaintySi).toBeCloseTo(1e-10, 22);
  });

  it('a negative separation is still an error naming the value column', () => {
    const { errors } = read([['GW 1', 'limb_separation', '-0.01', '0.002', 'nm', '656.279', '']]);
    expect(errors).toMatchObject([{ row: 2, column: 'value' }]);
    expect(errors[0].message).toMatch(/0 or more/);
  });
});
