import { requirePositive } from './errors';
import { planckSpectralRadiance } from './planck';

/**
 * The colour of a blackbody at a temperature, as the HR diagram paints its
 * stars: Planck's law integrated against the CIE 1931 2° colour-matching
 * functions gives the chromaticity (x, y); CIE XYZ goes to sRGB by the
 * IEC 61966-2-1 matrix and transfer curve, brightness scaled so the
 * brightest channel is full.
 *
 * The colour-matching functions are the multi-lobe Gaussian fit of Wyman,
 * Sloan & Shirley (2013), "Simple Analytic Approximations to the CIE XYZ
 * Color Matching Functions", JCGT 2(2), 1–11 (coefficients from memory),
 * which follows the 1 nm CIE 1931 table to about 1 % of its peak: a table of
 * 471 × 3 numbers is not worth carrying for a plot's colour, and the
 * chromaticities it gives are checked against the published Planckian locus.
 */

/** One lobe of the fit: a Gaussian with different widths (nm) below and above its centre (nm). */
function lobe(lambdaNm: number, centreNm: number, widthBelowNm: number, widthAboveNm: number): number {
  const t = (lambdaNm - centreNm) / (lambdaNm < centreNm ? widthBelowNm : widthAboveNm);
  return Math.exp(-0.5 * t * t);
}

/**
 * CIE 1931 2° colour-matching functions x̄, ȳ, z̄ at a wavelength in nm.
 * @see Wyman, Sloan & Shirley (2013), JCGT 2(2), multi-lobe fit (from memory)
 */
export function colourMatching(lambdaNm: number): [number, number, number] {
  const x = 1.056 * lobe(lambdaNm, 599.8, 37.9, 31.0) + 0.362 * lobe(lambdaNm, 442.0, 16.0, 26.7) - 0.065 * lobe(lambdaNm, 501.1, 20.4, 26.2);
  const y = 0.821 * lobe(lambdaNm, 568.8, 46.9, 40.5) + 0.286 * lobe(lambdaNm, 530.9, 16.3, 31.1);
  const z = 1.217 * lobe(lambdaNm, 437.0, 11.8, 36.0) + 0.681 * lobe(lambdaNm, 459.0, 26.0, 13.8);
  return [x, y, z];
}

/** The CIE 1931 table's range, 360–830 nm, summed at 1 nm. */
const FIRST_NM = 360;
const LAST_NM = 830;
const MATCHING = Array.from({ length: LAST_NM - FIRST_NM + 1 }, (_, i) => colourMatching(FIRST_NM + i));

/**
 * CIE 1931 chromaticity (x, y) of a blackbody at a temperature in K.
 * @see Planck's law (planck.ts); CIE 15:2004, tristimulus values by summation at 1 nm
 */
export function blackbodyChromaticity(temperatureK: number): { x: number; y: number } {
  requirePositive(temperatureK, 'temperature');
  let X = 0;
  let Y = 0;
  let Z = 0;
  for (let i = 0; i < MATCHING.length; i++) {
    const b = planckSpectralRadiance((FIRST_NM + i) * 1e-9, temperatureK);
    X += b * MATCHING[i][0];
    Y += b * MATCHING[i][1];
    Z += b * MATCHING[i][2];
  }
  const sum = X + Y + Z;
  return { x: X / sum, y: Y / sum };
}

/** sRGB transfer curve (IEC 61966-2-1), linear 0–1 to encoded 0–1. */
function encode(c: number): number {
  return c <= 0.0031308 ? 12.92 * c : 1.055 * Math.pow(c, 1 / 2.4) - 0.055;
}

/**
 * sRGB colour (0–255 per channel) of a blackbody at a temperature in K, at
 * full brightness: the chromaticity from blackbodyChromaticity, to linear
 * sRGB by the IEC 61966-2-1 matrix (D65 white), scaled so the largest
 * channel is 1. The locus leaves the sRGB gamut below about 1900 K (no
 * display shows that deep an orange); a negative channel is clipped to 0.
 * @see IEC 61966-2-1:1999 (sRGB), matrix and transfer curve
 */
export function blackbodySrgb(temperatureK: number): [number, number, number] {
  const { x, y } = blackbodyChromaticity(temperatureK);
  const X = x / y;
  const Z = (1 - x - y) / y;
  const linear = [3.2406 * X - 1.5372 - 0.4986 * Z, -0.9689 * X + 1.8758 + 0.0415 * Z, 0.0557 * X - 0.204 + 1.057 * Z].map((c) => Math.max(0, c));
  const top = Math.max(...linear);
  return linear.map((c) => Math.round(255 * encode(c / top))) as [number, number, number];
}

/** The same colour as a CSS hex string (#rrggbb). */
export function blackbodyHex(temperatureK: number): string {
  return `#${blackbodySrgb(temperatureK)
    .map((c) => c.toString(16).padStart(2, '0'))
    .join('')}`;
}

/**
 * The colour of each temperature on a grid in log T, for painting thousands
 * of stars without integrating Planck's law for each: the colour changes by
 * less than one step of 8-bit sRGB between neighbouring entries at 256 steps
 * per decade.
 */
export function blackbodyColourTable(minK: number, maxK: number, stepsPerDecade = 256): { colourOf(temperatureK: number): string } {
  const logMin = Math.log10(minK);
  const n = Math.ceil((Math.log10(maxK) - logMin) * stepsPerDecade) + 1;
  const colours = Array.from({ length: n }, (_, i) => blackbodyHex(Math.pow(10, logMin + i / stepsPerDecade)));
  return {
    colourOf(temperatureK: number): string {
      const i = Math.round((Math.log10(temperatureK) - logMin) * stepsPerDecade);
      return colours[Math.min(n - 1, Math.max(0, i))];
    },
  };
}
