import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { PhysicsError } from '@shared/physics/errors';
import { classifyLuminosity, luminosityClassWithin, radiusPlausibilityWarnings } from '@shared/physics/luminosity-class';
import { deriveAll } from '@shared/physics/derive';
import { assumedClassLogLuminosity, assumedClassLuminosity, mainSequenceLogLuminosity, photometricDistance } from '@shared/physics/main-sequence';
import { spectralClass, spectralClassFromTemperature, spectralIndexOfType } from '@shared/physics/spectral-class';
import { DWARF_SEQUENCE } from '@shared/physics/tables/dwarf-sequence';

const L_SUN = CONSTANTS.L_sun.value;
const R_SUN = CONSTANTS.R_sun.value;

describe('the dwarf table as copied', () => {
  it('holds the 87 rows O3V–M9.5V of the handbook copy, hottest first and strictly decreasing in T (Pecaut & Mamajek 2013 / Mamajek 2024.05.15)', () => {
    expect(DWARF_SEQUENCE).toHaveLength(87);
    expect(DWARF_SEQUENCE[0].spectralType).toBe('O3V');
    expect(DWARF_SEQUENCE[86].spectralType).toBe('M9.5V');
    for (let i = 1; i < DWARF_SEQUENCE.length; i++) expect(DWARF_SEQUENCE[i].teffK).toBeLessThan(DWARF_SEQUENCE[i - 1].teffK);
    const g2 = DWARF_SEQUENCE.find((row) => row.spectralType === 'G2V');
    expect(g2).toMatchObject({ teffK: 5770, logLLsun: 0.01, radiusRsun: 1.012, bMinusVMag: 0.65, bcVMag: -0.085, absVMag: 4.8 });
    expect(DWARF_SEQUENCE[86].bMinusVMag).toBeNull();
  });
});

describe('spectral class from temperature', () => {
  it('5770 K is G2V, the table’s own row (Pecaut & Mamajek 2013)', () => {
    const cls = spectralClassFromTemperature(5770);
    expect(cls.label).toBe('G2');
    expect(cls.dwarfType).toBe('G2V');
    expect(cls.index).toBe(42);
  });

  it('every row’s own temperature gives back that row’s type (Pecaut & Mamajek 2013, all 87 rows)', () => {
    for (const row of DWARF_SEQUENCE) {
      const cls = spectralClassFromTemperature(row.teffK);
      expect(cls.dwarfType, `${row.teffK} K`).toBe(row.spectralType);
      expect(cls.index).toBeCloseTo(spectralIndexOfType(row.spectralType), 9);
    }
  });

  it('uses the table’s boundaries rather than the coarse ones: 7300 K lies between A9V (7400 K) and F0V (7220 K)', () => {
    expect(['A9V', 'F0V']).toContain(spectralClassFromTemperature(7300).dwarfType);
    expect(spectralClassFromTemperature(7220).label).toBe('F0');
  });

  it('the index grows as temperature falls (property, interpolation in log T)', () => {
    fc.assert(
      fc.property(fc.double({ min: 2330, max: 45_000, noNaN: true }), fc.double({ min: 1.001, max: 1.5, noNaN: true }), (t, k) => {
        const hotter = Math.min(t * k, 45_900);
        expect(spectralClassFromTemperature(hotter).index).toBeLessThan(spectralClassFromTemperature(t).index);
      }),
    );
  });

  it('carries a first-order σ of the index from σ_T: 100 K at 5700 K is 2.5 subclasses (G3V 5720 K and G4V 5680 K, one subclass apart; Pecaut & Mamajek 2013)', () => {
    const cls = spectralClass({ value: 5700, sigma: 100 });
    expect(cls.indexSigma).toBeCloseTo(2.5, 2);
  });

  it('refuses temperatures outside the table instead of extrapolating, naming the limit', () => {
    for (const t of [50_000, 2000]) {
      try {
        spectralClassFromTemperature(t);
        expect.unreachable();
      } catch (e) {
        expect((e as PhysicsError).code).toBe('out_of_range');
        expect((e as PhysicsError).limit).toBe('2330–45900 K');
      }
    }
  });
});

describe('main-sequence luminosity and the assumed class', () => {
  it('reproduces the table’s log L at its own temperatures (Pecaut & Mamajek 2013)', () => {
    for (const row of DWARF_SEQUENCE) expect(mainSequenceLogLuminosity(row.teffK)).toBeCloseTo(row.logLLsun, 9);
  });

  it('a giant is modelled at 10 R☉: at T☉ it has 100 L☉ (Stefan–Boltzmann with IAU 2015 B3 nominal values; the radius is common practice)', () => {
    expect(assumedClassLogLuminosity(5772, 'giant')).toBeCloseTo(2, 4);
  });

  it('the Monte Carlo σ of an assumed main-sequence luminosity includes the band’s intrinsic spread', () => {
    const mc = assumedClassLuminosity({ value: 5770, sigma: 0 }, 'main_sequence', { samples: 4000, seed: 4 });
    const widthDex = Math.log10(mc.high / mc.low) / 2;
    // The main-sequence band's 0.15 dex scatter (main-sequence.ts; common practice, from memory) around G2V's log L = 0.010 (Pecaut & Mamajek 2013).
    expect(widthDex).toBeCloseTo(0.15, 1);
    expect(mc.value / L_SUN).toBeCloseTo(10 ** 0.01, 6);
  });

  it('a G2V star of 10^0.010 L☉ seen with the flux it has at 100 pc is placed at 100 pc', () => {
    const l = 10 ** 0.01 * L_SUN;
    const d = 100 * CONSTANTS.pc.value;
    const flux = l / (4 * Math.PI * d * d);
    const mc = photometricDistance({ value: 5770, sigma: 0 }, 'main_sequence', { value: flux, sigma: 0 }, { samples: 500 });
    expect(mc.value / d).toBeCloseTo(1, 9);
  });
});

describe('luminosity class', () => {
  it('every row of the dwarf table is main sequence, with offset 0 (Pecaut & Mamajek 2013)', () => {
    for (const row of DWARF_SEQUENCE) {
      const cls = classifyLuminosity(row.teffK, 10 ** row.logLLsun * L_SUN);
      expect(cls.className, row.spectralType).toBe('main_sequence');
      expect(cls.offsetDex).toBeCloseTo(0, 9);
    }
  });

  it('the Sun (IAU 2015 B3 nominal) is main sequence', () => {
    expect(classifyLuminosity(5772, L_SUN).className).toBe('main_sequence');
  });

  it('classifies a red-clump-like giant, a red supergiant and a white dwarf by their radii (typical values from memory; thresholds common practice)', () => {
    const giant = 4 * Math.PI * (11 * R_SUN) ** 2 * CONSTANTS.sigma.value * 4700 ** 4;
    expect(classifyLuminosity(4700, giant).className).toBe('giant');
    const supergiant = 4 * Math.PI * (800 * R_SUN) ** 2 * CONSTANTS.sigma.value * 3600 ** 4;
    expect(classifyLuminosity(3600, supergiant).className).toBe('supergiant');
    const dwarf = 4 * Math.PI * (0.012 * R_SUN) ** 2 * CONSTANTS.sigma.value * 12_000 ** 4;
    expect(classifyLuminosity(12_000, dwarf).className).toBe('white_dwarf');
    const subgiant = 10 ** (mainSequenceLogLuminosity(5500) + 0.6) * L_SUN;
    expect(classifyLuminosity(5500, subgiant).className).toBe('subgiant');
  });

  it('warns when the radius does not fit the assumed class, naming the range (the red-clump-like giant of the test above, from memory; the Sun at IAU 2015 B3 nominal values)', () => {
    const warnings = radiusPlausibilityWarnings(11 * R_SUN, 4700, 'main_sequence');
    expect(warnings).toHaveLength(1);
    expect(warnings[0].code).toBe('radius_implausible_for_class');
    expect(warnings[0].limit).toMatch(/R☉$/);
    expect(radiusPlausibilityWarnings(1.0 * R_SUN, 5772, 'main_sequence')).toHaveLength(0);
    expect(radiusPlausibilityWarnings(11 * R_SUN, 4700, 'giant')).toHaveLength(0);
  });
});

describe('luminosity class near a boundary, and hot giants', () => {
  // The Sun's row of the dwarf table: G2V, 5770 K, log L/L☉ = 0.01 (Pecaut & Mamajek 2013 / Mamajek 2024.05.15).
  const SUN_ROW_LOGL = 0.01;

  it('a star 0.30 ± 0.10 dex above the main sequence, within 1σ of the 0.35 dex boundary, is "main sequence (V) or subgiant (IV)"', () => {
    const l = 10 ** (SUN_ROW_LOGL + 0.3) * L_SUN;
    const cls = luminosityClassWithin(5770, l, 0.1);
    expect(cls.candidates).toEqual(['main_sequence', 'subgiant']);
    expect(cls.label).toMatch(/^main sequence \(V\) or subgiant \(IV\)/);
    expect(cls.label).toMatch(/within 1σ/);
    expect(cls.warnings).toMatchObject([{ code: 'class_boundary', limit: 'Δ = 0.35 dex' }]);
  });

  it('one class, without a warning, when the 1σ range stays inside it (the Sun, Δ = 0 ± 0.05 dex)', () => {
    const cls = luminosityClassWithin(5770, 10 ** SUN_ROW_LOGL * L_SUN, 0.05);
    expect(cls.candidates).toEqual(['main_sequence']);
    expect(cls.label).toBe('main sequence (V)');
    expect(cls.warnings).toEqual([]);
  });

  it('a B5 giant is not called a subgiant alone: M_V(B5 III) = −2.2 (Schmidt-Kaler 1982, from memory) against M_V(B5V) = −0.85 (the dwarf table) puts it 0.54 dex up, in the offset band of subgiants', () => {
    // Same temperature, same BC_V: Δ log L = 0.4 × (−0.85 − (−2.2)) = 0.54 dex above B5V (15 700 K, log L = 2.772).
    const logL = 2.772 + 0.4 * (-0.85 + 2.2);
    expect(classifyLuminosity(15_700, 10 ** logL * L_SUN).className).toBe('subgiant');
    const cls = luminosityClassWithin(15_700, 10 ** logL * L_SUN, 0.05);
    expect(cls.candidates).toEqual(['subgiant', 'giant']);
    expect(cls.label).toMatch(/^subgiant \(IV\) or giant \(III\)/);
    expect(cls.warnings.map((w) => w.code)).toEqual(['class_boundary']);
  });

  it('through the engine: a B5 giant of given luminosity is labelled "subgiant (IV) or giant (III)" and the assumed class giant is not contradicted', () => {
    const logL = 2.772 + 0.4 * (-0.85 + 2.2);
    const graph = deriveAll(
      [
        { id: 'lum', kind: 'luminosity', valueSi: 10 ** logL * L_SUN, uncertaintySi: 0.1 * 10 ** logL * L_SUN },
        { id: 't', kind: 'planck_temperature', valueSi: 15_700, uncertaintySi: 200 },
      ],
      { assumedClass: 'giant' },
    );
    const cls = graph.results.luminosity_class!;
    expect(cls.label).toMatch(/subgiant \(IV\) or giant \(III\)/);
    expect(cls.warnings.map((w) => w.code)).toContain('class_boundary');
    expect(graph.results.luminosity_hr!.warnings.map((w) => w.code)).not.toContain('assumed_class');
  });
});
