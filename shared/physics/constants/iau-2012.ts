import { defineConstant } from './define';

/** IAU 2012 Resolution B2: the astronomical unit re-defined as a fixed length. */
export const IAU_2012 = Object.freeze({
  au: defineConstant({
    symbol: 'au',
    name: 'Astronomical unit',
    value: 149_597_870_700,
    unit: 'm',
    uncertainty: 0,
    reference: 'IAU 2012 Resolution B2; exact by definition',
  }),
});
