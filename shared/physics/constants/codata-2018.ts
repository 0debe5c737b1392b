import { defineConstant } from './define';

/**
 * CODATA 2018 recommended values (Tiesinga et al. 2021, Rev. Mod. Phys. 93,
 * 025010; NIST SP 961). c, h, k_B and e are exact by the 2019 SI definition;
 * b and σ follow from exact constants and are quoted to the digits CODATA
 * publishes, so their uncertainty is 0 (the truncation is below 1e-9).
 */
const SOURCE = 'CODATA 2018 (Tiesinga et al. 2021, Rev. Mod. Phys. 93, 025010)';

export const CODATA_2018 = Object.freeze({
  c: defineConstant({
    symbol: 'c',
    name: 'Speed of light in vacuum',
    value: 299_792_458,
    unit: 'm s-1',
    uncertainty: 0,
    reference: `${SOURCE}; exact by the SI definition`,
  }),
  h: defineConstant({
    symbol: 'h',
    name: 'Planck constant',
    value: 6.626_070_15e-34,
    unit: 'J s',
    uncertainty: 0,
    reference: `${SOURCE}; exact by the SI definition`,
  }),
  k_B: defineConstant({
    symbol: 'k_B',
    name: 'Boltzmann constant',
    value: 1.380_649e-23,
    unit: 'J K-1',
    uncertainty: 0,
    reference: `${SOURCE}; exact by the SI definition`,
  }),
  e: defineConstant({
    symbol: 'e',
    name: 'Elementary charge',
    value: 1.602_176_634e-19,
    unit: 'C',
    uncertainty: 0,
    reference: `${SOURCE}; exact by the SI definition`,
  }),
  m_e: defineConstant({
    symbol: 'm_e',
    name: 'Electron mass',
    value: 9.109_383_701_5e-31,
    unit: 'kg',
    uncertainty: 0.000_000_002_8e-31,
    reference: SOURCE,
  }),
  b: defineConstant({
    symbol: 'b',
    name: 'Wien wavelength displacement law constant',
    value: 2.897_771_955e-3,
    unit: 'm K',
    uncertainty: 0,
    reference: `${SOURCE}; exact (derived from exact h, c, k_B), quoted to the published digits`,
  }),
  sigma: defineConstant({
    symbol: 'sigma',
    name: 'Stefan–Boltzmann constant',
    value: 5.670_374_419e-8,
    unit: 'W m-2 K-4',
    uncertainty: 0,
    reference: `${SOURCE}; exact (derived from exact h, c, k_B), quoted to the published digits`,
  }),
});
