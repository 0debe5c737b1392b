import { describe, expect, it } from 'vitest';
import { blackbodyChromaticity, blackbodyColourTable, blackbodyHex, blackbodySrgb } from '@shared/physics/blackbody-colour';
import { HR_RADII_RSUN, hrRegionAt, hrRegions, logLuminosityAtRadius, radiusLine } from '@shared/physics/hr-diagram';
import { classifyLuminosity } from '@shared/physics/luminosity-class';
import { CONSTANTS } from '@shared/physics/constants';

/** Kim et al. (2002), J. Korean Phys. Soc. 41, 865, cubic approximation of the Planckian locus, from memory: x(T) then y(x), 4000–25 000 K. */
function kimLocus(t: number): { x: number; y: number } {
  const x = -3.0258469e9 / t ** 3 + 2.1070379e6 / t ** 2 + 0.2226347e3 / t + 0.24039;
  const y = 3.081758 * x ** 3 - 5.8733867 * x ** 2 + 3.75112997 * x - 0.37001483;
  return { x, y };
}

describe('blackbody colour', () => {
  it('puts a 6500 K blackbody at the CIE 1931 chromaticity x = 0.3135, y = 0.3237 (Planckian locus tables, e.g. Wyszecki & Stiles 1982, from memory)', () => {
    const c = blackbodyChromaticity(6500);
    expect(c.x).toBeCloseTo(0.3135, 3);
    expect(c.y).toBeCloseTo(0.3237, 3);
  });

  it('puts 2856 K at CIE illuminant A, x = 0.44757, y = 0.40745 (CIE 15:2004, Table T.3), within 0.002', () => {
    const c = blackbodyChromaticity(2856);
    expect(Math.abs(c.x - 0.44757)).toBeLessThan(0.002);
    expect(Math.abs(c.y - 0.40745)).toBeLessThan(0.002);
  });

  it('follows the Kim et al. (2002) cubic approximation of the Planckian locus within 0.002 from 4000 to 25 000 K', () => {
    for (const t of [4000, 5000, 7500, 10000, 15000, 25000]) {
      const ours = blackbodyChromaticity(t);
      const kim = kimLocus(t);
      expect(Math.abs(ours.x - kim.x)).toBeLessThan(0.002);
      expect(Math.abs(ours.y - kim.y)).toBeLessThan(0.002);
    }
  });

  it('gives near-white at 6500 K (close to D65, the sRGB white), orange-red for a cool star and blue for a hot one', () => {
    expect(Math.min(...blackbodySrgb(6500))).toBeGreaterThan(240);
    const [r3, g3, b3] = blackbodySrgb(3000);
    expect(r3).toBe(255);
    expect(b3).toBeLessThan(g3);
    const [r30, g30, b30] = blackbodySrgb(30000);
    expect(b30).toBe(255);
    expect(r30).toBeLessThan(g30);
  });

  it('the painting table gives the colour computed directly', () => {
    const table = blackbodyColourTable(2000, 60000);
    for (const t of [2000, 5772, 41000]) expect(table.colourOf(t)).toBe(blackbodyHex(t));
  });
});

describe('lines of constant radius (Stefan–Boltzmann)', () => {
  it('put the Sun (R☉ at the nominal 5772 K) at L☉ (IAU 2015 Resolution B3)', () => {
    expect(logLuminosityAtRadius(1, CONSTANTS.T_sun.value)).toBeCloseTo(0, 4);
  });

  it('rise 4 dex per dex of temperature and 2 dex per dex of radius, from 0.001 to 1000 R☉', () => {
    expect(HR_RADII_RSUN[0]).toBe(0.001);
    expect(HR_RADII_RSUN[HR_RADII_RSUN.length - 1]).toBe(1000);
    const [[x0, y0], [x1, y1]] = radiusLine(10, 3000, 30000);
    expect((y1 - y0) / (x1 - x0)).toBeCloseTo(4, 10);
    expect(logLuminosityAtRadius(100, 5000) - logLuminosityAtRadius(10, 5000)).toBeCloseTo(2, 10);
  });
});

describe('regions of the diagram', () => {
  // Known stars, values from memory: the Sun (IAU 2015 B3); Sirius B, 25 200 K, 0.0081 R☉ (Barstow et al. 2005);
  // Arcturus, 4290 K, 170 L☉ (Ramírez & Allende Prieto 2011); Betelgeuse, 3600 K, about 10⁵ L☉ (Levesque et al. 2005);
  // Procyon A (F5 IV–V, 6530 K, 6.9 L☉: Kervella et al. 2004) lies at the main sequence's upper edge.
  it('place well-known stars in their regions', () => {
    expect(hrRegionAt(5772, 0)).toBe('main_sequence');
    expect(hrRegionAt(25200, logLuminosityAtRadius(0.0081, 25200))).toBe('white_dwarf');
    expect(hrRegionAt(4290, Math.log10(170))).toBe('giant');
    expect(hrRegionAt(3600, 5)).toBe('supergiant');
    expect(['main_sequence', 'subgiant']).toContain(hrRegionAt(6530, Math.log10(6.9)));
  });

  it('agree with the engine’s classifier in the middle of every band', () => {
    for (const region of hrRegions(2400, 45000)) {
      for (const outline of region.outlines) {
        const half = outline.length / 2;
        for (let i = 5; i < half - 5; i += 10) {
          const [x, high] = outline[i];
          const low = outline[outline.length - 1 - i][1];
          const t = Math.pow(10, x);
          const l = CONSTANTS.L_sun.value * Math.pow(10, (low + high) / 2);
          expect(classifyLuminosity(t, l).className, `${region.className} at ${t.toFixed(0)} K`).toBe(region.className);
        }
      }
    }
  });
});
