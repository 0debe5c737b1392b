import { CODATA_2018 } from './codata-2018';
import { DERIVED } from './derived';
import type { PhysicalConstant } from './define';
import { IAU_2012 } from './iau-2012';
import { IAU_2015 } from './iau-2015';

export type { PhysicalConstant } from './define';
export { defineConstant } from './define';

/**
 * The editions Starledger computes with. Changing an edition is a change of
 * this one file, so every number derived afterwards says which edition it used.
 */
export const EDITIONS = Object.freeze({
  fundamental: 'CODATA 2018',
  astronomical: 'IAU 2015 Resolutions B2 and B3; IAU 2012 Resolution B2 (au)',
});

/** The selected constants, by symbol. */
export const CONSTANTS = Object.freeze({
  c: CODATA_2018.c,
  h: CODATA_2018.h,
  k_B: CODATA_2018.k_B,
  e: CODATA_2018.e,
  m_e: CODATA_2018.m_e,
  b: CODATA_2018.b,
  sigma: CODATA_2018.sigma,
  au: IAU_2012.au,
  L_sun: IAU_2015.L_sun,
  R_sun: IAU_2015.R_sun,
  T_sun: IAU_2015.T_sun,
  S_sun: IAU_2015.S_sun,
  L_0: IAU_2015.L_0,
  f_0: IAU_2015.f_0,
  pc: IAU_2015.pc,
  ly: DERIVED.ly,
  zeeman: DERIVED.zeeman,
});

export type ConstantSymbol = keyof typeof CONSTANTS;

/**
 * Every selected constant, for listing and for the test that each has its source.
 * @see CONVENTIONS.md, the reference-library constants model
 */
export function listConstants(): readonly PhysicalConstant[] {
  return Object.values(CONSTANTS);
}
