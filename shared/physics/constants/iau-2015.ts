import { defineConstant } from './define';
import { IAU_2012 } from './iau-2012';

/**
 * IAU 2015 Resolution B3 (nominal solar conversion constants; exact by
 * definition, they are units, not measurements of the Sun) and Resolution B2
 * (zero points of the bolometric magnitude scales, and the parsec).
 */
const B2 = 'IAU 2015 Resolution B2 (Mamajek et al. 2015, arXiv:1510.06262)';
const B3 = 'IAU 2015 Resolution B3 (Prša et al. 2016, AJ 152, 41)';

export const IAU_2015 = Object.freeze({
  L_sun: defineConstant({
    symbol: 'L_sun',
    name: 'Nominal solar luminosity',
    value: 3.828e26,
    unit: 'W',
    uncertainty: 0,
    reference: `${B3}; nominal value, exact by definition`,
  }),
  R_sun: defineConstant({
    symbol: 'R_sun',
    name: 'Nominal solar radius',
    value: 6.957e8,
    unit: 'm',
    uncertainty: 0,
    reference: `${B3}; nominal value, exact by definition`,
  }),
  T_sun: defineConstant({
    symbol: 'T_sun',
    name: 'Nominal solar effective temperature',
    value: 5772,
    unit: 'K',
    uncertainty: 0,
    reference: `${B3}; nominal value, exact by definition`,
  }),
  S_sun: defineConstant({
    symbol: 'S_sun',
    name: 'Nominal total solar irradiance',
    value: 1361,
    unit: 'W m-2',
    uncertainty: 0,
    reference: `${B3}; nominal value, exact by definition`,
  }),
  L_0: defineConstant({
    symbol: 'L_0',
    name: 'Zero point of the absolute bolometric magnitude scale',
    value: 3.0128e28,
    unit: 'W',
    uncertainty: 0,
    reference: `${B2}; M_bol = 0 at L_0, exact by definition`,
  }),
  f_0: defineConstant({
    symbol: 'f_0',
    name: 'Zero point of the apparent bolometric magnitude scale',
    value: 2.518_021_002e-8,
    unit: 'W m-2',
    uncertainty: 0,
    reference: `${B2}; m_bol = 0 at f_0, exact by definition`,
  }),
  pc: defineConstant({
    symbol: 'pc',
    name: 'Parsec',
    value: (648_000 / Math.PI) * IAU_2012.au.value,
    unit: 'm',
    uncertainty: 0,
    reference: `${B2}: pc = (648 000 / π) au, computed here from au of IAU 2012 Resolution B2; exact`,
  }),
});
