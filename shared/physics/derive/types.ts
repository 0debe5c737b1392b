import type { ConstantSymbol } from '../constants';
import type { PhysicsErrorCode, PhysicsWarning } from '../errors';
import type { LuminosityClassName } from '../main-sequence';
import type { QuantityId } from '../quantities';

/** Identifier of a stored measurement, as the caller keeps it. */
export type MeasurementId = string | number;

/**
 * One measurement of one target as the engine receives it: value and 1-sigma
 * uncertainty already in SI (MEASUREMENT_SI_UNIT: m, W m⁻², rad, mag, K).
 * `kind` is one of MEASUREMENT_KINDS; anything else is reported, not thrown.
 */
export interface MeasurementInput {
  id: MeasurementId;
  kind: string;
  valueSi: number;
  /** 1-sigma in the same SI unit; 0 or omitted = not given (the results say so). */
  uncertaintySi?: number;
  /** `magnitude`: the band (V, B); `colour_index`: the pair (B-V). */
  band?: string;
  /** `line_wavelength`, `limb_separation`, `zeeman_separation`: the line's rest wavelength, m. */
  restWavelengthSi?: number;
  restWavelengthUncertaintySi?: number;
  /** `zeeman_separation`: the line's Landé factor. */
  landeG?: number;
  /** Wavelengths in standard air (default; optical line lists quote air) or in vacuum. */
  medium?: 'air' | 'vacuum';
  /**
   * The stored spectrum a `peak_wavelength` or `planck_temperature` was read
   * from. Readings of one spectrum are not independent: the Monte Carlo
   * moves them together (see evaluate.ts).
   */
  spectrumId?: MeasurementId;
}

/** Choices that change what the engine derives. */
export interface DeriveOptions {
  /** Luminosity class assumed for the spectroscopic-parallax route (default main_sequence). */
  assumedClass?: LuminosityClassName;
  /** R_V = A_V / E(B−V) (default 3.1, Cardelli, Clayton & Mathis 1989). */
  rV?: number;
  /** Monte Carlo draws of every measurement, pushed through the whole graph (default 1000). */
  monteCarloSamples?: number;
  /**
   * The target's seed (default 1): each measurement draws its own stream from
   * it and its id. The server derives it from the project and the target,
   * so that two targets never share draws and a re-run gives the same digits.
   */
  seed?: number;
}

export type ResolvedOptions = Required<DeriveOptions>;

/** How a result's uncertainty was obtained. */
export type Propagation = 'first_order' | 'monte_carlo' | 'combination' | 'as_measured';

/** One derived quantity with everything needed to review it. */
export interface DerivedResult {
  quantity: QuantityId;
  /** Value in `unit` (SI; see QUANTITY_SI_UNIT). */
  value: number;
  /** 1-sigma uncertainty in `unit`. */
  uncertainty: number;
  unit: string;
  /** A word for a value that is a category: the spectral class ("G2"), the luminosity class. */
  label?: string;
  /**
   * Central 68.27 % interval of the Monte Carlo draws, given where it is
   * asymmetric about the value (see ASYMMETRY_LIMIT); σ is half its width.
   */
  interval?: { low: number; high: number };
  method: { id: string; label: string };
  propagation: Propagation;
  /** Ids of every measurement the value rests on, directly or through other quantities. */
  inputs: MeasurementId[];
  /** Derived quantities it was computed from. */
  dependsOn: QuantityId[];
  /** Quantities it was cross-checked against (their changes can change its warnings). */
  checkedAgainst: QuantityId[];
  /** Symbols of the constants used (see CONSTANTS). */
  constants: ConstantSymbol[];
  warnings: PhysicsWarning[];
}

/** Something the engine could not use or derive; it carries no value. */
export interface DerivationIssue {
  /** The quantity that could not be derived, or null for a measurement no quantity uses. */
  quantity: QuantityId | null;
  measurementId?: MeasurementId;
  code: PhysicsErrorCode | 'measurement_unused';
  message: string;
  limit?: string;
}

/** All a target's derivations. */
export interface DerivationGraph {
  results: Partial<Record<QuantityId, DerivedResult>>;
  issues: DerivationIssue[];
  options: ResolvedOptions;
}
