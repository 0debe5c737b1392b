import { describe, expect, it } from 'vitest';
import { crossChecks, sigmaApart } from '@shared/physics/cross-checks';

/*
 * Every value below is INVENTED for the test; none is a measurement of a real
 * star. The σ distances are checked against |a − b| / √(σa² + σb²) worked by
 * hand here, not against the module's own arithmetic.
 * The solar radius is the IAU 2015 nominal value, R☉ = 6.957 × 10⁸ m
 * (IAU Resolution B3, Prša et al. 2016, AJ 152, 41).
 */
const PC = 3.0856775814913673e16; // m, IAU 2015 Resolution B2 (1 pc = 648 000/π au, au = 149 597 870 700 m)
const RSUN = 6.957e8;

describe('sigmaApart (invented values)', () => {
  it('is |a − b| / √(σa² + σb²)', () => {
    // 100 ± 3 and 110 ± 2: 10 / √13 = 2.7735…
    expect(sigmaApart({ value: 100, uncertainty: 3 }, { value: 110, uncertainty: 2 })).toBeCloseTo(10 / Math.sqrt(13), 12);
    expect(10 / Math.sqrt(13)).toBeCloseTo(2.7735, 4);
    // 5000 ± 30 and 5040 ± 40: 40 / 50 = 0.8 exactly (a 3-4-5 triangle).
    expect(sigmaApart({ value: 5000, uncertainty: 30 }, { value: 5040, uncertainty: 40 })).toBeCloseTo(0.8, 12);
  });

  it('is symmetric and undefined without any σ', () => {
    const a = { value: 7, uncertainty: 1 };
    const b = { value: 3, uncertainty: 1 };
    expect(sigmaApart(a, b)).toBe(sigmaApart(b, a));
    expect(sigmaApart({ value: 1, uncertainty: 0 }, { value: 2, uncertainty: 0 })).toBeNull();
  });
});

describe('crossChecks in plain words (invented values)', () => {
  it('says how far the parallax and photometric distances differ', () => {
    // 100 ± 3 pc and 130 ± 9 pc: 30 / √(9 + 81) = 30 / 9.4868 = 3.162… → "3.2 σ", past the engine's 3 σ.
    const checks = crossChecks([
      { quantity: 'distance_parallax', value: 100 * PC, uncertainty: 3 * PC },
      { quantity: 'distance_photometric', value: 130 * PC, uncertainty: 9 * PC },
    ]);
    expect(checks).toHaveLength(1);
    expect(checks[0].sigmaApart).toBeCloseTo(30 / Math.sqrt(90), 9);
    expect(checks[0].text).toBe('The parallax and photometric distances differ by 3.2 σ, more than the 3 σ the engine accepts.');
    expect(checks[0].verdict).toBe('disagree');
  });

  it('says the Wien and Planck temperatures agree within 1 σ, and a 2 σ gap is within the engine’s limit', () => {
    const checks = crossChecks([
      { quantity: 'temperature_wien', value: 5000, uncertainty: 30 },
      { quantity: 'temperature_planck', value: 5040, uncertainty: 40 },
      // 5000 ± 30 against 5100 ± 40: 100 / 50 = 2.0 σ.
      { quantity: 'temperature_colour', value: 5100, uncertainty: 40 },
    ]);
    const byId = Object.fromEntries(checks.map((c) => [c.id, c]));
    expect(byId['temperature_wien-temperature_planck'].text).toBe('The Wien and Planck temperatures agree within 1 σ (0.8 σ apart).');
    expect(byId['temperature_wien-temperature_colour'].text).toBe('The Wien and colour temperatures differ by 2.0 σ, within the 3 σ the engine accepts.');
    // 5100 ± 40 against 5040 ± 40: 60 / √3200 = 1.06 σ.
    expect(byId['temperature_colour-temperature_planck'].sigmaApart).toBeCloseTo(60 / Math.sqrt(3200), 9);
  });

  it('says a radius of 40 R☉ does not fit a main-sequence star, and 1 R☉ at 5800 K does', () => {
    const at = (radiusRsun: number) =>
      crossChecks([
        { quantity: 'radius', value: radiusRsun * RSUN, uncertainty: 0.1 * RSUN },
        { quantity: 'temperature', value: 5800, uncertainty: 50 },
        { quantity: 'luminosity_class', value: 0, uncertainty: 0.05, label: 'main sequence (V)' },
      ]).find((c) => c.id === 'radius_class');
    expect(at(40)?.text).toMatch(/^A radius of 40 R☉ does not fit a main-sequence star \(.+ R☉ at 5800 K\)\.$/);
    expect(at(40)?.verdict).toBe('disagree');
    expect(at(1)?.text).toBe('A radius of 1 R☉ fits a main-sequence star at 5800 K.');
  });

  it('checks no radius against an unsettled class, and repeats the engine’s own disagreement notes once', () => {
    const message = 'temperature estimates disagree: temperature_wien and temperature_planck differ by 4.1 σ';
    const checks = crossChecks([
      { quantity: 'radius', value: 40 * RSUN, uncertainty: RSUN },
      { quantity: 'temperature', value: 5800, uncertainty: 50, warnings: [{ code: 'temperatures_disagree', quantity: 'temperature', message }] },
      { quantity: 'temperature_wien', value: 5800, uncertainty: 50, warnings: [{ code: 'temperatures_disagree', quantity: 'temperature', message }] },
      { quantity: 'luminosity_class', value: 0.3, uncertainty: 0.1, label: 'main sequence (V) or subgiant (IV), within 1σ (0.10 dex) of the class boundary' },
    ]);
    expect(checks.find((c) => c.id === 'radius_class')).toBeUndefined();
    const notes = checks.filter((c) => c.verdict === 'note');
    expect(notes).toHaveLength(1);
    expect(notes[0].text).toBe('Temperature estimates disagree: effective temperature (Wien) and effective temperature (Planck fit) differ by 4.1 σ.');
  });
});
