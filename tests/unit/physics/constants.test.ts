import { describe, expect, it } from 'vitest';
import { CONSTANTS, defineConstant, listConstants } from '@shared/physics/constants';
import { CODATA_2018 } from '@shared/physics/constants/codata-2018';
import { IAU_2015 } from '@shared/physics/constants/iau-2015';
import { PhysicsError } from '@shared/physics/errors';

describe('constants', () => {
  it('every selected constant has a symbol, name, unit, reference and a finite value (the reference-library record)', () => {
    const all = listConstants();
    expect(all.length).toBeGreaterThanOrEqual(15);
    for (const c of all) {
      expect(c.symbol.trim()).not.toBe('');
      expect(c.name.trim()).not.toBe('');
      expect(c.unit.trim()).not.toBe('');
      expect(c.reference.trim()).not.toBe('');
      expect(Number.isFinite(c.value)).toBe(true);
      expect(c.uncertainty).toBeGreaterThanOrEqual(0);
      expect(Object.isFrozen(c)).toBe(true);
    }
  });

  it('a constant without a reference cannot be created', () => {
    expect(() => defineConstant({ symbol: 'x', name: 'X', value: 1, unit: 'm', uncertainty: 0, reference: '' })).toThrow(PhysicsError);
    expect(() => defineConstant({ symbol: 'x', name: 'X', value: 1, unit: '', uncertainty: 0, reference: 'somewhere' })).toThrow(PhysicsError);
    expect(() => defineConstant({ symbol: 'x', name: 'X', value: Number.NaN, unit: 'm', uncertainty: 0, reference: 'somewhere' })).toThrow(PhysicsError);
  });

  it('each constant names the edition it comes from', () => {
    for (const c of Object.values(CODATA_2018)) expect(c.reference).toContain('CODATA 2018');
    for (const c of Object.values(IAU_2015)) expect(c.reference).toMatch(/IAU 2015 Resolution B[23]/);
    expect(CONSTANTS.au.reference).toContain('IAU 2012 Resolution B2');
  });

  it('b and σ as CODATA 2018 publishes them agree with their exact expressions in h, c, k_B (CODATA 2018)', () => {
    const { h, c, k_B } = CONSTANTS;
    // x solves x = 5 (1 − e^−x) (maximum of B_λ); b = hc / (k_B x)
    let x = 5;
    for (let i = 0; i < 40; i++) x -= (x - 5 * (1 - Math.exp(-x))) / (1 - 5 * Math.exp(-x));
    const b = (h.value * c.value) / (k_B.value * x);
    expect(Math.abs(b / CONSTANTS.b.value - 1)).toBeLessThan(1e-9);
    const sigma = (2 * Math.PI ** 5 * k_B.value ** 4) / (15 * h.value ** 3 * c.value ** 2);
    expect(Math.abs(sigma / CONSTANTS.sigma.value - 1)).toBeLessThan(1e-9);
  });

  it('pc = 648 000/π au = 3.085 677 581 491 367e16 m (IAU 2015 Resolution B2)', () => {
    expect(CONSTANTS.pc.value).toBeCloseTo(3.085_677_581_491_367e16, -1);
    expect(Math.abs(CONSTANTS.pc.value / 3.085_677_581_491_367e16 - 1)).toBeLessThan(1e-15);
    expect(CONSTANTS.pc.reference).toContain('648 000');
  });

  it('ly = Julian year × c = 9.460 730 472 580 8e15 m (IAU Julian year, CODATA c)', () => {
    expect(CONSTANTS.ly.value).toBe(9.460_730_472_580_8e15);
    expect(CONSTANTS.ly.reference).toContain('Julian year');
  });

  it('the IAU 2015 B3 nominal solar values and B2 zero points are as adopted (IAU 2015 Resolutions B2, B3)', () => {
    expect(CONSTANTS.L_sun.value).toBe(3.828e26);
    expect(CONSTANTS.R_sun.value).toBe(6.957e8);
    expect(CONSTANTS.T_sun.value).toBe(5772);
    expect(CONSTANTS.S_sun.value).toBe(1361);
    expect(CONSTANTS.L_0.value).toBe(3.0128e28);
    expect(CONSTANTS.f_0.value).toBe(2.518_021_002e-8);
  });

  it('m_e carries its CODATA 2018 standard uncertainty 0.000 000 0028e-31 kg; exact constants carry 0', () => {
    expect(CONSTANTS.m_e.uncertainty).toBeCloseTo(2.8e-40, 45);
    expect(CONSTANTS.c.uncertainty).toBe(0);
    expect(CONSTANTS.h.uncertainty).toBe(0);
  });
});
