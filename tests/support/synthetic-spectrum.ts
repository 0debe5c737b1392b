/**
 * Synthetic blackbody spectra for the tests, with noise from a generator
 * written here rather than the engine's, so that a test of the spectrum route
 * does not lean on the code it checks.
 *
 * The blackbody itself is computed here from Planck's law with the CODATA 2018
 * values of h, c and k_B typed in, for the same reason.
 */
import { normalDeviates } from './reference-random';

/** CODATA 2018 (exact by the 2019 SI): Planck constant, speed of light, Boltzmann constant. */
const H = 6.62607015e-34;
const C = 299792458;
const K_B = 1.380649e-23;
/** CODATA 2018 Wien wavelength displacement constant b, m K. */
export const WIEN_B = 2.897771955e-3;

/** Planck's law B_λ(T) in W m⁻² m⁻¹ sr⁻¹ (CODATA 2018 h, c, k_B). */
export function blackbody(wavelengthM: number, temperatureK: number): number {
  return (2 * H * C * C) / wavelengthM ** 5 / Math.expm1((H * C) / (wavelengthM * K_B * temperatureK));
}

export interface SyntheticOptions {
  temperatureK: number;
  fromM: number;
  toM: number;
  points: number;
  seed: number;
  /** Noise as a share of the flux at each point (noise ∝ flux). */
  relativeNoise?: number;
  /** Noise as a share of the largest flux in the range, the same at every point. */
  constantNoise?: number;
  /** Scale on B_λ, as (R/d)² π would be for a star; any positive number. */
  scale?: number;
}

/** Evenly sampled noisy blackbody; `fluxSigma` is the noise that was drawn from, for tests that pass it on. */
export function syntheticSpectrum(o: SyntheticOptions): { wavelengthM: number[]; flux: number[]; fluxSigma: number[] } {
  const normal = normalDeviates(o.seed);
  const scale = o.scale ?? 1e-20;
  const wavelengthM: number[] = [];
  const clean: number[] = [];
  for (let i = 0; i < o.points; i++) {
    const l = o.fromM + ((o.toM - o.fromM) * i) / (o.points - 1);
    wavelengthM.push(l);
    clean.push(scale * blackbody(l, o.temperatureK));
  }
  const top = clean.reduce((m, f) => Math.max(m, f), 0);
  const fluxSigma = clean.map((f) => (o.relativeNoise ?? 0) * f + (o.constantNoise ?? 0) * top);
  const flux = clean.map((f, i) => f + fluxSigma[i] * normal());
  return { wavelengthM, flux, fluxSigma };
}
