import { describe, expect, it } from 'vitest';
import { derivedValueTexts, quantityNameInText, sigmaChangeText } from '@/lib/derived-words';

/*
 * The lines the target sheet and the review queue print for a derived value.
 * Lengths: 1 pc = 648 000/π au (IAU 2015 Resolution B2) with 1 au =
 * 149 597 870 700 m (IAU 2012 Resolution B2), so 1 pc = 3.085 677 581 49 × 10¹⁶ m;
 * 1 ly = 9 460 730 472 580 800 m (IAU: a Julian year of 365.25 d at c).
 */
const PC_M = (648_000 / Math.PI) * 149_597_870_700;
const LY_M = 9_460_730_472_580_800;

describe('derived value lines', () => {
  it('prints a parallax distance in parsecs and light years with σ rounded to one figure', () => {
    // 40 pc ± 0.8 pc; in ly: 40 × PC_M / LY_M = 130.46 ly, σ 2.609 ly. σ 0.8 (leading digits 800) keeps one figure,
    // σ 2.609 (leading 261) keeps two: "130.5 ± 2.6 ly".
    expect(40 * (PC_M / LY_M)).toBeCloseTo(130.46, 2);
    const texts = derivedValueTexts({ quantity: 'distance_parallax', value: 40 * PC_M, uncertainty: 0.8 * PC_M, unit: 'm', label: null });
    expect(texts).toEqual(['40.0 ± 0.8 pc', '130.5 ± 2.6 ly']);
  });

  it('says how σ changes in one unit when both revisions share it', () => {
    // 120 K (leading 120) keeps two figures, 60 K (leading 600) one.
    const approved = { quantity: 'temperature', value: 5800, uncertainty: 120, unit: 'K', label: null };
    const proposed = { quantity: 'temperature', value: 5790, uncertainty: 60, unit: 'K', label: null };
    expect(sigmaChangeText(approved, proposed)).toBe('σ 120 → 60 K');
  });

  it('keeps the power of ten with each σ of a value printed in scientific form', () => {
    const approved = { quantity: 'bolometric_flux', value: 6.87e-12, uncertainty: 0.23e-12, unit: 'W/m2', label: null };
    const proposed = { quantity: 'bolometric_flux', value: 6.5e-12, uncertainty: 0.4e-12, unit: 'W/m2', label: null };
    expect(sigmaChangeText(approved, proposed)).toBe('σ 0.23 × 10⁻¹² W m⁻² → 0.4 × 10⁻¹² W m⁻²');
  });

  // Morgan & Keenan's sequence, ten subclasses a class: index 42 is G2, so 42 ± 1.04 spans G1–G3 and 42.1 ± 0.2 stays in G2.
  it('says how the uncertainty of a spectral class changes as ranges of types, not fractions of a subclass', () => {
    const approved = { quantity: 'spectral_class', value: 42, uncertainty: 1.04, unit: '1', label: 'G2' };
    const proposed = { quantity: 'spectral_class', value: 42.1, uncertainty: 0.2, unit: '1', label: 'G2' };
    expect(derivedValueTexts(approved)).toEqual(['G2, G1–G3']);
    expect(sigmaChangeText(approved, proposed)).toBe('1σ range G1–G3 → G2');
  });

  it('falls back to the stored SI figures for a quantity the display does not know', () => {
    expect(derivedValueTexts({ quantity: 'surface_gravity', value: 274, uncertainty: 3, unit: 'm/s2', label: null })).toEqual(['274 ± 3 m/s2']);
  });

  it('names a quantity inside a sentence in lower case', () => {
    expect(quantityNameInText('temperature_wien')).toBe('effective temperature (Wien)');
  });

  it('prints a non-detection as its upper limit, then the measured value (0 ± 456.8 m/s: "< 0.46 km s⁻¹ (1σ)")', () => {
    // v sin i = c σ_Δλ / (2 λ₀) for 0 ± 0.002 nm at Hα 656.279 nm: 299 792 458 × 0.002 / 1312.558 = 456.8 m/s (CODATA c).
    const sigma = (299_792_458 * 0.002) / (2 * 656.279);
    const warnings = [{ code: 'upper_limit', quantity: 'rotation_velocity', message: 'not detected', limit: '< 0.46 km s⁻¹ (1σ)' }];
    const texts = derivedValueTexts({ quantity: 'rotation_velocity', value: 0, uncertainty: sigma, unit: 'm/s', label: null, warnings });
    expect(texts).toEqual(['< 0.46 km s⁻¹ (1σ), not detected (0.0 ± 0.5 km s⁻¹)']);
  });
});
