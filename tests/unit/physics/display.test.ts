import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { formatMeasured, formatResult } from '@shared/physics/display';

describe('display of values with uncertainties', () => {
  it('keeps two significant figures of σ for leading digits 100–354 and one for 355–949 (PDG rounding rule, common practice, from memory)', () => {
    expect(formatMeasured(5772.4, 12.3, 'K').text).toBe('5772 ± 12 K');
    expect(formatMeasured(5772.4, 47, 'K').text).toBe('5770 ± 50 K');
    expect(formatMeasured(0.6512, 0.0123, 'mag').text).toBe('0.651 ± 0.012 mag');
    expect(formatMeasured(4.7396, 0.0096, 'mag').text).toBe('4.740 ± 0.010 mag');
  });

  it('prints large and small numbers as (mantissa ± σ) × 10ⁿ with a true minus sign', () => {
    expect(formatMeasured(3.828e26, 2e24, 'W').text).toBe('(3.828 ± 0.020) × 10²⁶ W');
    expect(formatMeasured(2.5e-9, 1e-10, 'W m⁻²').text).toBe('(2.50 ± 0.10) × 10⁻⁹ W m⁻²');
    expect(formatMeasured(-26.832, 0, 'mag').text).toBe('\u221226.83 mag');
  });

  it('groups long integers with thin spaces and shows a skewed Monte Carlo interval as +a/−b', () => {
    expect(formatMeasured(17_412, 310, 'K').text).toBe('17\u2009410 ± 310 K');
    expect(formatMeasured(100, 20, 'pc', { low: 90, high: 140 }).text).toBe('100 +40/\u221210 pc');
  });

  it('shows distances in pc and ly (IAU 2015 B2 pc, Julian-year ly) and luminosity in L☉ (IAU 2015 B3)', () => {
    const d = formatResult({ quantity: 'distance_parallax', value: 10 * CONSTANTS.pc.value, uncertainty: 0.1 * CONSTANTS.pc.value });
    expect(d.values.map((v) => v.text)).toEqual(['10.00 ± 0.10 pc', '32.62 ± 0.33 ly']);
    const l = formatResult({ quantity: 'luminosity', value: CONSTANTS.L_sun.value, uncertainty: 0.05 * CONSTANTS.L_sun.value });
    expect(l.values[0].text).toBe('1.00 ± 0.05 L☉');
  });

  it('shows velocities in km/s, fields in G or kG, and classes by their labels', () => {
    expect(formatResult({ quantity: 'radial_velocity', value: 9592.7, uncertainty: 2280 }).values[0].text).toBe('9.6 ± 2.3 km s⁻¹');
    expect(formatResult({ quantity: 'magnetic_field', value: 0.1295, uncertainty: 0.0259 }).values[0].text).toBe('1.30 ± 0.26 kG');
    expect(formatResult({ quantity: 'magnetic_field', value: 0.01, uncertainty: 0.002 }).values[0].text).toBe('100 ± 20 G');
    const sc = formatResult({ quantity: 'spectral_class', value: 42, uncertainty: 1.04, label: 'G2' });
    expect(sc.values[0].text).toBe('G2, G1–G3');
  });

  // Morgan & Keenan's sequence: ten subclasses a class, G9 followed by K0; Pecaut & Mamajek's table adds half types such as F9.5 and M0.5.
  it('prints a spectral class with the types its 1σ spans, never a fraction of a subclass', () => {
    const text = (value: number, uncertainty: number, label: string) => formatResult({ quantity: 'spectral_class', value, uncertainty, label }).values[0].text;
    expect(text(50, 1.2, 'K0')).toBe('K0, G9–K1');
    expect(text(39.6, 0.6, 'G0')).toBe('G0, F9–G0');
    expect(text(42, 0.2, 'G2')).toBe('G2 (1σ inside G2)');
    expect(text(42, 0, 'G2')).toBe('G2');
    expect(text(42, 0.04, 'G2')).not.toMatch(/±|subclass/);
  });
});

describe('readable warning text', () => {
  it('names quantities in words instead of ids', async () => {
    const { readableMessage } = await import('@shared/physics/display');
    expect(readableMessage('temperature estimates: temperature_wien and temperature_planck differ by 4.0 σ')).toBe(
      'temperature estimates: effective temperature (Wien) and effective temperature (Planck fit) differ by 4.0 σ',
    );
  });
});
