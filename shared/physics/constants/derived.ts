import { CODATA_2018 } from './codata-2018';
import { defineConstant } from './define';

/**
 * Constants no single edition states but that follow exactly from defined
 * ones; each reference writes out its derivation.
 */

/** Seconds in a Julian year: 365.25 days of 86 400 s (the IAU's Julian year). */
const JULIAN_YEAR_S = 365.25 * 86_400;

export const DERIVED = Object.freeze({
  ly: defineConstant({
    symbol: 'ly',
    name: 'Light-year',
    value: JULIAN_YEAR_S * CODATA_2018.c.value,
    unit: 'm',
    uncertainty: 0,
    reference: 'Julian year (365.25 × 86 400 s, IAU) × c (CODATA 2018, exact); computed here; exact',
  }),
  zeeman: defineConstant({
    symbol: 'zeeman',
    name: 'Normal Zeeman displacement coefficient e / (4π m_e c)',
    value: CODATA_2018.e.value / (4 * Math.PI * CODATA_2018.m_e.value * CODATA_2018.c.value),
    unit: 'm-1 T-1',
    // Only m_e carries an uncertainty; relative uncertainty of the quotient equals m_e's.
    uncertainty:
      (CODATA_2018.e.value / (4 * Math.PI * CODATA_2018.m_e.value * CODATA_2018.c.value)) *
      (CODATA_2018.m_e.uncertainty / CODATA_2018.m_e.value),
    reference:
      'Δλ = g e λ² B / (4π m_e c); e, m_e, c from CODATA 2018, computed here (4.6686e-13 Å⁻¹ G⁻¹ in astronomers\' units)',
  }),
});
