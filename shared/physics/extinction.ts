import { requireFinite, requirePositive } from './errors';

/**
 * R_V = A_V / E(B−V) for the diffuse interstellar medium.
 * @see Cardelli, Clayton & Mathis (1989), ApJ 345, 245
 */
export const DEFAULT_R_V = 3.1;

/**
 * Visual extinction A_V = R_V E(B−V), in mag, from the colour excess in mag.
 * @see Cardelli, Clayton & Mathis (1989), ApJ 345, 245
 */
export function visualExtinctionMag(colourExcessMag: number, rV: number = DEFAULT_R_V): number {
  requireFinite(colourExcessMag, 'extinction');
  requirePositive(rV, 'R_V');
  return rV * colourExcessMag;
}

/**
 * Intrinsic colour (B−V)₀ = (B−V) − E(B−V), all in mag.
 * @see REFERENCES.md "Dereddening"
 */
export function dereddenedColourMag(colourIndexMag: number, colourExcessMag: number): number {
  requireFinite(colourIndexMag, 'colour_index');
  requireFinite(colourExcessMag, 'extinction');
  return colourIndexMag - colourExcessMag;
}

/**
 * Extinction-corrected magnitude V₀ = V − A_V, in mag.
 * @see REFERENCES.md "Dereddening"
 */
export function dereddenedMagnitudeMag(magnitudeMag: number, extinctionMag: number): number {
  requireFinite(magnitudeMag, 'magnitude');
  requireFinite(extinctionMag, 'A_V');
  return magnitudeMag - extinctionMag;
}
