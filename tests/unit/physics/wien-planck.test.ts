import { describe, expect, it } from 'vitest';
import { CONSTANTS } from '@shared/physics/constants';
import { PhysicsError } from '@shared/physics/errors';
import { findContinuumPeak, fitPlanck, planckPeakWavelengthM, planckSpectralRadiance } from '@shared/physics/planck';
import { gaussian, mulberry32 } from '@shared/physics/random';
import { wienPeakWavelengthM, wienTemperature, wienTemperatureK } from '@shared/physics/wien';

describe("Wien's displacement law", () => {
  it('λmax = 600 nm gives 4829.62 K (CODATA 2018 b = 2.897 771 955e-3 m K)', () => {
    expect(wienTemperatureK(600e-9)).toBeCloseTo(4829.62, 2);
  });

  it('propagates σ_T / T = σ_λ / λ (REFERENCES.md, first order for a power law)', () => {
    const t = wienTemperature({ value: 600e-9, sigma: 6e-9 });
    expect(t.sigma / t.value).toBeCloseTo(0.01, 12);
  });

  it('refuses a non-positive or non-finite wavelength with a typed error naming the quantity', () => {
    for (const bad of [0, -500e-9, Number.NaN, Number.POSITIVE_INFINITY]) {
      try {
        wienTemperatureK(bad);
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(PhysicsError);
        expect((e as PhysicsError).quantity).toBe('peak_wavelength');
      }
    }
  });
});

describe('Planck function', () => {
  it('its maximum, solved from h, c and k_B alone, agrees with Wien b / T (CODATA 2018)', () => {
    for (const t of [3000, 5772, 10_000, 30_000]) {
      expect(Math.abs(planckPeakWavelengthM(t) / wienPeakWavelengthM(t) - 1)).toBeLessThan(1e-9);
    }
  });

  it('a direct search over B_λ finds its maximum at b / T (CODATA 2018 b)', () => {
    const t = 5772;
    // golden-section search for the maximum of B_λ between 100 nm and 2000 nm
    let a = 100e-9;
    let b = 2000e-9;
    const g = (Math.sqrt(5) - 1) / 2;
    for (let i = 0; i < 200; i++) {
      const c = b - g * (b - a);
      const d = a + g * (b - a);
      if (planckSpectralRadiance(c, t) > planckSpectralRadiance(d, t)) b = d;
      else a = c;
    }
    expect(Math.abs((a + b) / 2 / (CONSTANTS.b.value / t) - 1)).toBeLessThan(1e-6);
  });

  it('integrates to σT⁴/π over wavelength (Stefan–Boltzmann, CODATA 2018 σ)', () => {
    const t = 5772;
    let sum = 0;
    // trapezoid in ln λ from 10 nm to 1 mm
    const n = 20_000;
    const lo = Math.log(10e-9);
    const hi = Math.log(1e-3);
    for (let i = 0; i <= n; i++) {
      const l = Math.exp(lo + ((hi - lo) * i) / n);
      const w = i === 0 || i === n ? 0.5 : 1;
      sum += w * planckSpectralRadiance(l, t) * l;
    }
    sum *= (hi - lo) / n;
    expect(sum / ((CONSTANTS.sigma.value * t ** 4) / Math.PI)).toBeCloseTo(1, 5);
  });
});

/** A synthetic blackbody spectrum with Gaussian noise from a seeded generator. */
function syntheticSpectrum(temperatureK: number, noiseFraction: number, seed: number, fromM = 350e-9, toM = 1000e-9, points = 300) {
  const normal = gaussian(mulberry32(seed));
  const scale = 2.5e-20;
  const peakFlux = scale * planckSpectralRadiance(wienPeakWavelengthM(temperatureK), temperatureK);
  const wavelengthM: number[] = [];
  const flux: number[] = [];
  const fluxSigma: number[] = [];
  for (let i = 0; i < points; i++) {
    const l = fromM + ((toM - fromM) * i) / (points - 1);
    const s = noiseFraction * peakFlux;
    wavelengthM.push(l);
    flux.push(scale * planckSpectralRadiance(l, temperatureK) + s * normal());
    fluxSigma.push(s);
  }
  return { wavelengthM, flux, fluxSigma, scale };
}

describe('Planck fit', () => {
  it('recovers the temperature of a noisy synthetic 5800 K blackbody within 3σ, with a sensible σ (generated with h, c, k_B of CODATA 2018)', () => {
    const spectrum = syntheticSpectrum(5800, 0.02, 42);
    const fit = fitPlanck(spectrum);
    expect(Math.abs(fit.temperatureK.value - 5800)).toBeLessThan(3 * fit.temperatureK.sigma);
    expect(fit.temperatureK.sigma).toBeGreaterThan(1);
    expect(fit.temperatureK.sigma).toBeLessThan(100);
    // 300 points and 2 parameters: χ²/ν scatters about 1 by √(2/298) ≈ 0.08 (the χ² distribution), so 0.7–1.4 allows about −4 to +5 of that.
    expect(fit.reducedChiSquare).toBeGreaterThan(0.7);
    expect(fit.reducedChiSquare).toBeLessThan(1.4);
    expect(Math.exp(fit.logScale.value) / spectrum.scale).toBeCloseTo(1, 1);
  });

  it('over many seeds, about 68 % of fits fall within 1σ of the true temperature (the covariance gives honest σ)', () => {
    let inside = 0;
    const trials = 60;
    for (let seed = 1; seed <= trials; seed++) {
      const fit = fitPlanck(syntheticSpectrum(9000, 0.03, seed));
      if (Math.abs(fit.temperatureK.value - 9000) < fit.temperatureK.sigma) inside++;
    }
    expect(inside / trials).toBeGreaterThan(0.5);
    expect(inside / trials).toBeLessThan(0.85);
  });

  it('fits without per-point σ, and recovers a cool 3500 K star from its Wien side only, with a warning', () => {
    const { wavelengthM, flux } = syntheticSpectrum(3500, 0.01, 7, 350e-9, 700e-9, 200);
    const fit = fitPlanck({ wavelengthM, flux });
    expect(Math.abs(fit.temperatureK.value - 3500)).toBeLessThan(Math.max(3 * fit.temperatureK.sigma, 20));
    expect(fit.warnings.map((w) => w.code)).toContain('outside_calibration');
  });

  it('refuses too few points, non-positive wavelengths and a spectrum with no positive flux', () => {
    expect(() => fitPlanck({ wavelengthM: [4e-7, 5e-7, 6e-7], flux: [1, 2, 1] })).toThrow(PhysicsError);
    expect(() => fitPlanck({ wavelengthM: [4e-7, 0, 6e-7, 7e-7], flux: [1, 2, 1, 1] })).toThrow(PhysicsError);
    expect(() => fitPlanck({ wavelengthM: [4e-7, 5e-7, 6e-7, 7e-7], flux: [-1, -2, -1, -1] })).toThrow(PhysicsError);
    expect(() => fitPlanck({ wavelengthM: [4e-7, 5e-7, 6e-7, 7e-7], flux: [1, Number.NaN, 1, 1] })).toThrow(PhysicsError);
  });
});

describe('continuum peak', () => {
  it('finds the peak of a 5800 K blackbody with absorption lines near b / T (CODATA 2018 b)', () => {
    const { wavelengthM, flux } = syntheticSpectrum(5800, 0.01, 3, 300e-9, 900e-9, 601);
    // Deep narrow lines, as a stellar spectrum has, must not move the peak.
    for (const centre of [410e-9, 434e-9, 486e-9, 500e-9, 517e-9, 589e-9, 656e-9]) {
      for (let i = 0; i < wavelengthM.length; i++) {
        const d = (wavelengthM[i] - centre) / 0.6e-9;
        flux[i] *= 1 - 0.6 * Math.exp(-0.5 * d * d);
      }
    }
    const peak = findContinuumPeak({ wavelengthM, flux });
    const expected = CONSTANTS.b.value / 5800;
    expect(Math.abs(peak.value - expected)).toBeLessThan(Math.max(3 * peak.sigma, 10e-9));
    expect(peak.sigma).toBeGreaterThan(0);
  });

  it('has an honest σ: over 60 noisy 5200 K spectra the peak lies within 2σ of b / T in most and within 3σ in nearly all (CODATA 2018 b)', () => {
    const expected = CONSTANTS.b.value / 5200;
    let within2 = 0;
    let within3 = 0;
    for (let seed = 1; seed <= 60; seed++) {
      // 1 % noise on 131 points over 350–1000 nm, the shape of a small spectrograph's calibrated output.
      const { wavelengthM, flux } = syntheticSpectrum(5200, 0.01, seed, 350e-9, 1000e-9, 131);
      const peak = findContinuumPeak({ wavelengthM, flux });
      const z = Math.abs(peak.value - expected) / peak.sigma;
      if (z < 2) within2++;
      if (z < 3) within3++;
    }
    // A Gaussian puts 95.4 % within 2σ and 99.7 % within 3σ; allow for the cubic's small model error.
    expect(within2).toBeGreaterThanOrEqual(50);
    expect(within3).toBeGreaterThanOrEqual(57);
  });

  it('uses the flux uncertainties when the spectrum gives them', () => {
    const { wavelengthM, flux, fluxSigma } = syntheticSpectrum(5200, 0.01, 7, 350e-9, 1000e-9, 131);
    const weighted = findContinuumPeak({ wavelengthM, flux, fluxSigma });
    expect(Math.abs(weighted.value - CONSTANTS.b.value / 5200)).toBeLessThan(3 * weighted.sigma);
  });

  it('refuses a spectrum whose continuum rises to one end (the peak lies outside it)', () => {
    const { wavelengthM, flux } = syntheticSpectrum(3000, 0.001, 5, 400e-9, 700e-9, 100);
    try {
      findContinuumPeak({ wavelengthM, flux });
      expect.unreachable();
    } catch (e) {
      expect((e as PhysicsError).code).toBe('peak_at_edge');
    }
  });
});
