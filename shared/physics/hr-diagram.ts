import { CONSTANTS } from './constants';
import { DWARF_TABLE_RANGE_K } from './dwarf-table';
import { LUMINOSITY_CLASS_THRESHOLDS, PLAUSIBLE_RADIUS } from './luminosity-class';
import { LUMINOSITY_CLASS_LABELS, mainSequenceLogLuminosity, type LuminosityClassName } from './main-sequence';
import { luminosityFromRadiusW } from './stefan-boltzmann';

/**
 * The drawing of the HR diagram, from the relations the engine classifies
 * with, so a star's label and the region it is drawn in cannot disagree by
 * more than the choice of band edges named below. Coordinates are
 * (log10 T/K, log10 L/L☉).
 */

/** The lines of constant radius drawn on the diagram, R☉. */
export const HR_RADII_RSUN = [0.001, 0.01, 0.1, 1, 10, 100, 1000] as const;

const L_SUN = CONSTANTS.L_sun.value;
const R_SUN = CONSTANTS.R_sun.value;

/**
 * log10(L/L☉) of a star of a radius in R☉ at a temperature in K, by L = 4π R² σ T⁴.
 * @see stefan-boltzmann.ts (CODATA 2018 σ; IAU 2015 B3 nominal R☉, L☉)
 */
export function logLuminosityAtRadius(radiusRsun: number, temperatureK: number): number {
  return Math.log10(luminosityFromRadiusW(radiusRsun * R_SUN, temperatureK) / L_SUN);
}

/** A line of constant radius across a temperature range: straight in log L against log T (slope 4), so its two ends. */
export function radiusLine(radiusRsun: number, minK: number, maxK: number): [[number, number], [number, number]] {
  return [
    [Math.log10(minK), logLuminosityAtRadius(radiusRsun, minK)],
    [Math.log10(maxK), logLuminosityAtRadius(radiusRsun, maxK)],
  ];
}

export interface HrRegion {
  readonly className: LuminosityClassName;
  readonly label: string;
  /** Closed outlines in (log T, log L); more than one where the band is cut in two by the diagram's range. */
  readonly outlines: readonly (readonly [number, number])[][];
  /** Where the name goes: the middle of the region's longest stretch in log T, halfway up the band there. */
  readonly labelAt: readonly [number, number];
}

type Band = (temperatureK: number) => { low: number; high: number } | null;

const inTable = (t: number) => t >= DWARF_TABLE_RANGE_K.min && t <= DWARF_TABLE_RANGE_K.max;
const msLog = (t: number) => mainSequenceLogLuminosity(t, 'luminosity_class');
const th = LUMINOSITY_CLASS_THRESHOLDS;

/**
 * Each class's band at one temperature, in log L/L☉:
 * - main sequence: from the dwarf sequence (Pecaut & Mamajek 2013) less a
 *   factor PLAUSIBLE_RADIUS.mainSequenceFactor in radius (the sheet's
 *   radius check) up to the classifier's mainSequenceMaxOffsetDex, and never
 *   below its white-dwarf radius;
 * - subgiant: the classifier's offsets mainSequenceMaxOffsetDex–subgiantMaxOffsetDex;
 * - giant and supergiant: above subgiantMaxOffsetDex, split at
 *   supergiantMinLogLsun, within each class's PLAUSIBLE_RADIUS;
 * - white dwarf: PLAUSIBLE_RADIUS.white_dwarf, under the classifier's
 *   whiteDwarfMaxOffsetDex where the dwarf table reaches.
 * The classes with an offset stop where the dwarf table stops (2330–45900 K):
 * the engine does not extrapolate it, and neither does the drawing.
 */
const BANDS: Readonly<Record<LuminosityClassName, Band>> = {
  main_sequence: (t) => {
    if (!inTable(t)) return null;
    const ms = msLog(t);
    const low = Math.max(ms - 2 * Math.log10(PLAUSIBLE_RADIUS.mainSequenceFactor), logLuminosityAtRadius(th.whiteDwarfMaxRadiusRsun, t));
    return { low, high: ms + th.mainSequenceMaxOffsetDex };
  },
  subgiant: (t) => (inTable(t) ? { low: msLog(t) + th.mainSequenceMaxOffsetDex, high: msLog(t) + th.subgiantMaxOffsetDex } : null),
  giant: (t) => {
    if (!inTable(t)) return null;
    const low = Math.max(msLog(t) + th.subgiantMaxOffsetDex, logLuminosityAtRadius(PLAUSIBLE_RADIUS.giant.min, t));
    return { low, high: Math.min(th.supergiantMinLogLsun, logLuminosityAtRadius(PLAUSIBLE_RADIUS.giant.max, t)) };
  },
  supergiant: (t) => {
    if (!inTable(t)) return null;
    const low = Math.max(msLog(t) + th.subgiantMaxOffsetDex, th.supergiantMinLogLsun, logLuminosityAtRadius(PLAUSIBLE_RADIUS.supergiant.min, t));
    return { low, high: logLuminosityAtRadius(PLAUSIBLE_RADIUS.supergiant.max, t) };
  },
  white_dwarf: (t) => {
    const low = logLuminosityAtRadius(PLAUSIBLE_RADIUS.white_dwarf.min, t);
    let high = logLuminosityAtRadius(PLAUSIBLE_RADIUS.white_dwarf.max, t);
    if (inTable(t)) high = Math.min(high, msLog(t) + th.whiteDwarfMaxOffsetDex);
    return { low, high };
  },
};

/**
 * The five regions over a temperature range in K, sampled at `samples`
 * temperatures evenly spaced in log T (the dwarf table is linear in log T
 * between rows, so a few hundred samples follow it to well under a pixel).
 */
export function hrRegions(minK: number, maxK: number, samples = 240): HrRegion[] {
  const logMin = Math.log10(minK);
  const step = (Math.log10(maxK) - logMin) / (samples - 1);
  return (Object.keys(BANDS) as LuminosityClassName[]).map((className) => {
    const outlines: [number, number][][] = [];
    let run: { x: number; low: number; high: number }[] = [];
    let best: { x: number; low: number; high: number } | null = null;
    let longest = 0;
    const close = () => {
      if (run.length > longest) {
        longest = run.length;
        best = run[Math.floor(run.length / 2)];
      }
      if (run.length > 1) outlines.push([...run.map((p) => [p.x, p.high] as [number, number]), ...run.reverse().map((p) => [p.x, p.low] as [number, number])]);
      run = [];
    };
    for (let i = 0; i < samples; i++) {
      const x = logMin + i * step;
      const band = BANDS[className](Math.pow(10, x));
      if (band && band.high > band.low) {
        run.push({ x, ...band });
      } else close();
    }
    close();
    const at = best as { x: number; low: number; high: number } | null;
    return { className, label: LUMINOSITY_CLASS_LABELS[className], outlines, labelAt: at ? [at.x, (at.low + at.high) / 2] : [logMin, 0] };
  });
}

/** The region a point (T in K, log10 L/L☉) is drawn in, or null between regions. */
export function hrRegionAt(temperatureK: number, logLsun: number): LuminosityClassName | null {
  for (const className of Object.keys(BANDS) as LuminosityClassName[]) {
    const band = BANDS[className](temperatureK);
    if (band && logLsun >= band.low && logLsun < band.high) return className;
  }
  return null;
}
