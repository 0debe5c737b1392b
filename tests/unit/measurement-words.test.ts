import { describe, expect, it } from 'vitest';
import { bandName, measurementKindName, unitSymbol } from '@/lib/measurement-words';

describe('measurement words', () => {
  it('prints the units as sent in a file with the symbols astronomers write (L☉ for the IAU 2015 B3 nominal solar luminosity)', () => {
    expect(unitSymbol('Lsun')).toBe('L☉');
    expect(unitSymbol('L☉')).toBe('L☉');
    expect(unitSymbol('kpc')).toBe('kpc');
    expect(unitSymbol('angstrom')).toBe('Å');
    expect(unitSymbol('W/m2')).toBe('W m⁻²');
    expect(unitSymbol('furlong')).toBe('furlong');
    expect(unitSymbol(null)).toBe('');
  });

  it('names a distance or luminosity known from elsewhere as such', () => {
    expect(measurementKindName('distance')).toBe('Distance (known from elsewhere)');
    expect(measurementKindName('luminosity')).toBe('Luminosity (known from elsewhere)');
  });

  // Colour indices (Johnson's B−V, Gaia's BP−RP) are printed with a minus sign (U+2212), as in E(B−V); a band's own name stays as sent.
  it('prints a colour band with a true minus sign', () => {
    expect(bandName('B-V')).toBe('B\u2212V');
    expect(bandName('U - B')).toBe('U\u2212B');
    expect(bandName('V')).toBe('V');
    expect(bandName('BP-RP')).toBe('BP\u2212RP');
    expect(bandName('Gaia-G')).toBe('Gaia-G');
  });
});
