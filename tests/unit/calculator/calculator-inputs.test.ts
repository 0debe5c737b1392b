import { describe, expect, it } from 'vitest';
import { emptyForm, parseNumber, readForm } from '@/features/calculator/components/calculator-inputs';

describe('calculator inputs', () => {
  it('reads numbers with a decimal point, an exponent or a true minus sign, and refuses a decimal comma', () => {
    expect(parseNumber('486.1')).toBe(486.1);
    expect(parseNumber('2.5e-9')).toBe(2.5e-9);
    expect(parseNumber('\u22120.32')).toBe(-0.32);
    expect(parseNumber('  ')).toBeNull();
    expect(parseNumber('0,65')).toBe('decimal_comma');
    expect(parseNumber('abc')).toBe('not_a_number');
  });

  it('an empty form is no measurement at all', () => {
    expect(readForm(emptyForm()).measurements).toEqual([]);
  });

  it('converts typed values to SI: nm and Å to m, mas to rad, erg s⁻¹ cm⁻² to W m⁻² (SI Brochure; 1 erg = 1e-7 J)', () => {
    const form = emptyForm();
    form.peak = { value: '5000', sigma: '50', unit: 'angstrom' };
    form.parallax = { value: '10', sigma: '0.5' };
    form.flux = { value: '2', sigma: '0.1', unit: 'erg/s/cm2' };
    const { measurements } = readForm(form);
    const byId = Object.fromEntries(measurements.map((m) => [m.id, m]));
    expect(byId.peak.valueSi).toBeCloseTo(5e-7, 20);
    expect(byId.peak.uncertaintySi).toBeCloseTo(5e-9, 22);
    expect(byId.parallax.valueSi).toBeCloseTo((10e-3 / 3600) * (Math.PI / 180), 20);
    expect(byId.flux.valueSi).toBeCloseTo(2e-3, 18);
  });

  it('a distance and a luminosity known from elsewhere go in as their own kinds, in SI (IAU 2015 B2: 1 pc = 648 000/π au, L☉ = 3.828e26 W; IAU 2012 B2 au; 1 ly = c × 365.25 d)', () => {
    const form = emptyForm();
    form.distance = { value: '2.5', sigma: '0.1', unit: 'kpc' };
    form.luminosity = { value: '120', sigma: '10', unit: 'L_sun' };
    const byId = Object.fromEntries(readForm(form).measurements.map((m) => [m.id, m]));
    expect(byId.distance).toMatchObject({ kind: 'distance' });
    expect(byId.distance.valueSi / 3.0856775814913673e19).toBeCloseTo(2.5, 12);
    expect(byId.distance.uncertaintySi! / 3.0856775814913673e19).toBeCloseTo(0.1, 12);
    expect(byId.luminosity).toMatchObject({ kind: 'luminosity' });
    expect(byId.luminosity.valueSi / 3.828e26).toBeCloseTo(120, 10);
    form.distance = { value: '100', sigma: '', unit: 'ly' };
    expect(readForm(form).measurements.find((m) => m.id === 'distance')!.valueSi).toBeCloseTo(100 * 299792458 * 365.25 * 86400, -2);
  });

  it('a pick-list line is an air wavelength; with vacuum chosen it moves by the air–vacuum shift of Hβ, 0.1358 nm (Morton 2000: 4861.363 Å air ↔ 4862.721 Å vacuum)', () => {
    const form = emptyForm();
    form.line = { ...form.line, value: '486.2', sigma: '0.01', rest: { line: 'h_beta', custom: '' }, medium: 'air' };
    expect(readForm(form).measurements[0]).toMatchObject({ kind: 'line_wavelength', restWavelengthSi: 486.135e-9, medium: 'air' });
    form.line.medium = 'vacuum';
    expect((readForm(form).measurements[0].restWavelengthSi! - 486.135e-9) / 1e-9).toBeCloseTo(0.1358, 4);
  });

  it('names the field that cannot be read, and leaves it out', () => {
    const form = emptyForm();
    form.bv = { value: '0,65', sigma: '' };
    form.v = { value: '', sigma: '0.02' };
    form.zeeman = { ...form.zeeman, value: '0.04', sigma: '0.01', rest: { line: 'other', custom: '5250.2' }, landeG: '' };
    const { measurements, fieldErrors } = readForm(form);
    expect(measurements).toEqual([]);
    expect(fieldErrors.bv).toContain('decimal point');
    expect(fieldErrors.v).toContain('value');
    expect(fieldErrors.zeeman).toContain('Landé g');
  });

  it('a Zeeman shift with its line and g becomes a measurement with the typed rest wavelength', () => {
    const form = emptyForm();
    form.zeeman = { ...form.zeeman, value: '0.04', sigma: '0.01', unit: 'angstrom', rest: { line: 'other', custom: '5250.2' }, landeG: '3' };
    expect(readForm(form).measurements[0]).toMatchObject({ kind: 'zeeman_separation', landeG: 3 });
    expect(readForm(form).measurements[0].restWavelengthSi).toBeCloseTo(5250.2e-10, 18);
  });

  it('passes the assumed class and R_V to the engine, and refuses R_V ≤ 0', () => {
    const form = emptyForm();
    form.assumedClass = 'giant';
    form.rV = '5.0';
    expect(readForm(form).options).toEqual({ assumedClass: 'giant', rV: 5 });
    form.rV = '0';
    expect(readForm(form).fieldErrors.rV).toBeDefined();
  });
});
