import { PhysicsError, requireFinite, type PhysicsWarning } from './errors';
import { dereddenedColourMag } from './extinction';
import type { Measured } from './measured';
import { monteCarlo, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo';

/**
 * The (B−V)₀ range inside which Ballesteros's relation is used without a
 * warning. Common practice: the relation saturates for hot stars (B−V = −0.32
 * gives about 17 400 K, far below a real O star) and is singular at −0.674.
 * @see REFERENCES.md "Colour temperature"
 */
export const BALLESTEROS_COLOUR_RANGE_MAG = Object.freeze({ min: -0.4, max: 2.0 });

/** Where 0.92 (B−V) + 0.62 = 0 and the relation diverges. */
const SINGULAR_COLOUR_MAG = -0.62 / 0.92;

/**
 * Effective temperature in K from the intrinsic colour (B−V)₀ in mag:
 * T = 4600 K [1 / (0.92 (B−V)₀ + 1.7) + 1 / (0.92 (B−V)₀ + 0.62)].
 * Throws PhysicsError('out_of_range') at and below the singular colour −0.674.
 * @see Ballesteros (2012), EPL 97, 34008
 */
export function ballesterosTemperatureK(colourIndexMag: number): number {
  requireFinite(colourIndexMag, 'colour_index');
  if (colourIndexMag <= SINGULAR_COLOUR_MAG) {
    throw new PhysicsError(
      'out_of_range',
      'colour_index',
      `B−V = ${colourIndexMag.toFixed(3)} mag is at or below −0.674 mag, where the Ballesteros relation is singular`,
      '> −0.674 mag',
    );
  }
  const x = 0.92 * colourIndexMag;
  return 4600 * (1 / (x + 1.7) + 1 / (x + 0.62));
}

/**
 * Warnings for a (B−V)₀ outside the range where the relation is trusted
 * (common practice: −0.4 < (B−V)₀ < 2.0 mag).
 * @see REFERENCES.md "Colour temperature"
 */
export function colourTemperatureWarnings(intrinsicColourMag: number): PhysicsWarning[] {
  const { min, max } = BALLESTEROS_COLOUR_RANGE_MAG;
  if (intrinsicColourMag > min && intrinsicColourMag < max) return [];
  return [
    {
      code: 'outside_calibration',
      quantity: 'temperature_colour',
      message: `(B−V)₀ = ${intrinsicColourMag.toFixed(3)} mag lies outside ${min} to ${max} mag, where the Ballesteros relation is trusted; hot stars come out far too cool`,
      limit: `${min} < (B−V)₀ < ${max} mag`,
    },
  ];
}

/** A colour temperature with its Monte Carlo uncertainty and warnings. */
export interface ColourTemperature {
  readonly temperatureK: MonteCarloResult;
  readonly intrinsicColourMag: number;
  readonly warnings: PhysicsWarning[];
}

/**
 * Colour temperature in K from B−V in mag, optionally dereddened by E(B−V)
 * in mag. The relation is strongly non-linear, so σ_T comes from a seeded
 * Monte Carlo over (B−V, E(B−V)); draws across the singularity are rejected
 * and counted.
 * @see Ballesteros (2012), EPL 97, 34008; JCGM 101:2008
 */
export function colourTemperature(
  colourIndexMag: Measured,
  colourExcessMag: Measured | undefined,
  options: MonteCarloOptions = {},
): ColourTemperature {
  const excess = colourExcessMag ?? { value: 0, sigma: 0 };
  const intrinsic = dereddenedColourMag(colourIndexMag.value, excess.value);
  const temperatureK = monteCarlo((x) => ballesterosTemperatureK(x[0] - x[1]), [colourIndexMag, excess], 'temperature_colour', options);
  return { temperatureK, intrinsicColourMag: intrinsic, warnings: colourTemperatureWarnings(intrinsic) };
}
