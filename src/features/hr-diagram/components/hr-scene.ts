import type { HrStar } from '@shared/schemas/hr';
import { CONSTANTS } from '@shared/physics/constants';
import { blackbodyColourTable } from '@shared/physics/blackbody-colour';
import { HR_RADII_RSUN, hrRegions, radiusLine } from '@shared/physics/hr-diagram';

/**
 * The HR diagram as one description in CSS pixels, drawn twice from the same
 * numbers: on a canvas for the page (thousands of points) and as an SVG
 * string for saving. Hot stars on the left: x grows as log T falls.
 */

const L_SUN = CONSTANTS.L_sun.value;

export interface Palette {
  paper: string;
  ink: string;
  inkSoft: string;
  rule: string;
  accent: string;
  /** Night theme: stars in the theme's red instead of their blackbody colour, which would break red-only light. */
  redOnly: boolean;
}

export interface PlotStar {
  star: HrStar;
  x: number;
  y: number;
  /** Error bar ends in pixels (x: hotter end left). */
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  colour: string;
  highlighted: boolean;
}

export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
  logTMin: number;
  logTMax: number;
  logLMin: number;
  logLMax: number;
}

export interface Scene {
  frame: Frame;
  stars: PlotStar[];
  xTicks: { x: number; label: string }[];
  yTicks: { y: number; label: string }[];
  radii: { points: [number, number][]; label: string; labelAt: [number, number] }[];
  regions: { outlines: [number, number][][]; label: string; labelAt: [number, number] }[];
  /** Whether any star is highlighted (the rest are then drawn fainter). */
  highlighting: boolean;
}

const T_TICKS = [1000, 2000, 3000, 4000, 5000, 6000, 8000, 10000, 15000, 20000, 30000, 40000, 60000, 100000, 200000];
const SUPERSCRIPT = '⁰¹²³⁴⁵⁶⁷⁸⁹';

/** 10ⁿ as astronomers write a decade; 1 and 10 plainly. */
function decade(n: number): string {
  if (n === 0) return '1';
  if (n === 1) return '10';
  const digits = String(Math.abs(n))
    .split('')
    .map((d) => SUPERSCRIPT[Number(d)])
    .join('');
  return `10${n < 0 ? '⁻' : ''}${digits}`;
}

function groupThousands(n: number): string {
  return n >= 10000 ? String(n).replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009') : String(n);
}

/** The diagram's range: the usual stellar span, widened to hold every star and its error bars. */
function domain(stars: HrStar[]): Pick<Frame, 'logTMin' | 'logTMax' | 'logLMin' | 'logLMax'> {
  let tMin = Math.log10(2500);
  let tMax = Math.log10(40000);
  let lMin = -4;
  let lMax = 6;
  for (const s of stars) {
    const t = Math.log10(s.temperature.value);
    const l = Math.log10(s.luminosity.value / L_SUN);
    if (t - 0.05 < tMin) tMin = t - 0.05;
    if (t + 0.05 > tMax) tMax = t + 0.05;
    if (l - 0.5 < lMin) lMin = l - 0.5;
    if (l + 0.5 > lMax) lMax = l + 0.5;
  }
  // Past these no star of any class is known; a wild value should not squash the rest into a corner.
  return { logTMin: Math.max(3, tMin), logTMax: Math.min(5.5, tMax), logLMin: Math.max(-6, Math.floor(lMin)), logLMax: Math.min(8, Math.ceil(lMax)) };
}

const colours = blackbodyColourTable(1000, 320000);

export function buildScene(
  stars: HrStar[],
  size: { width: number; height: number },
  palette: Palette,
  highlightTag: string | null,
): Scene {
  const narrow = size.width < 520;
  const frame: Frame = {
    width: size.width,
    height: size.height,
    left: narrow ? 46 : 64,
    right: size.width - (narrow ? 10 : 20),
    top: 14,
    bottom: size.height - (narrow ? 42 : 50),
    ...domain(stars),
  };
  const { left, right, top, bottom, logTMin, logTMax, logLMin, logLMax } = frame;
  const xOf = (logT: number) => left + ((logTMax - logT) / (logTMax - logTMin)) * (right - left);
  const yOf = (logL: number) => top + ((logLMax - logL) / (logLMax - logLMin)) * (bottom - top);
  const clampX = (x: number) => Math.min(right, Math.max(left, x));
  const clampY = (y: number) => Math.min(bottom, Math.max(top, y));

  const plotted: PlotStar[] = stars.map((star) => {
    const t = star.temperature.value;
    const l = star.luminosity.value / L_SUN;
    const sT = star.temperature.sigma;
    const sL = star.luminosity.sigma / L_SUN;
    // The bar runs from value − σ to value + σ in the quantity itself, so on log axes it is lopsided, as it should be.
    const tLow = t - sT > 0 ? Math.log10(t - sT) : logTMin;
    const lLow = l - sL > 0 ? Math.log10(l - sL) : logLMin;
    return {
      star,
      x: xOf(Math.log10(t)),
      y: yOf(Math.log10(l)),
      x0: clampX(xOf(Math.log10(t + sT))),
      x1: clampX(xOf(tLow)),
      y0: clampY(yOf(Math.log10(l + sL))),
      y1: clampY(yOf(lLow)),
      colour: palette.redOnly ? palette.ink : colours.colourOf(t),
      highlighted: highlightTag !== null && star.tags.includes(highlightTag),
    };
  });

  const minGap = narrow ? 44 : 56;
  const xTicks: Scene['xTicks'] = [];
  for (const t of [...T_TICKS].reverse()) {
    const lt = Math.log10(t);
    if (lt < logTMin || lt > logTMax) continue;
    const x = xOf(lt);
    if (xTicks.length > 0 && x - xTicks[xTicks.length - 1].x < minGap) continue;
    xTicks.push({ x, label: groupThousands(t) });
  }
  const yTicks: Scene['yTicks'] = [];
  const everyOther = (bottom - top) / (logLMax - logLMin) < 22;
  for (let n = Math.ceil(logLMin); n <= logLMax; n++) {
    if (everyOther && n % 2 !== 0) continue;
    yTicks.push({ y: yOf(n), label: decade(n) });
  }

  const tMinK = Math.pow(10, logTMin);
  const tMaxK = Math.pow(10, logTMax);
  const radii: Scene['radii'] = HR_RADII_RSUN.map((r) => {
    const [[aT, aL], [bT, bL]] = radiusLine(r, tMinK, tMaxK);
    const points: [number, number][] = [
      [xOf(aT), yOf(aL)],
      [xOf(bT), yOf(bL)],
    ];
    // The label sits where the line leaves the top or the left edge of the plot, inside it.
    const [[xa, ya], [xb, yb]] = points;
    const slope = (yb - ya) / (xb - xa);
    let lx = left + 4;
    let ly = ya + slope * (lx - xa);
    if (ly < top + 12) {
      ly = top + 12;
      lx = xa + (ly - ya) / slope;
    }
    return { points, label: `${r} R☉`, labelAt: [lx + 3, ly - 3] as [number, number] };
  }).filter((line) => line.labelAt[0] < right - 40 && line.labelAt[1] < bottom - 4);

  const regions: Scene['regions'] = hrRegions(tMinK, tMaxK).map((region) => ({
    outlines: region.outlines.map((outline) => outline.map(([lt, ll]) => [xOf(lt), clampY(yOf(ll))] as [number, number])),
    label: region.label,
    // Kept clear of the frame's edges, where the radius labels sit.
    labelAt: [xOf(region.labelAt[0]), Math.min(bottom - 8, Math.max(top + 28, yOf(region.labelAt[1])))],
  }));

  return { frame, stars: plotted, xTicks, yTicks, radii, regions, highlighting: highlightTag !== null };
}

/** Point radius in CSS px: smaller when the plot is crowded, so 10 000 stars stay readable. */
export function pointRadius(count: number, highlighted: boolean): number {
  const base = count > 2000 ? 2.5 : count > 300 ? 3 : 4.5;
  return highlighted ? base + 2 : base;
}

/** The outline that keeps a pale star visible on paper: thinner on small points, or it would hide their colour. */
export function outlineWidth(count: number, highlighted: boolean): number {
  if (highlighted) return 2;
  return count > 2000 ? 0.35 : count > 300 ? 0.5 : 0.75;
}

/** Error bars fade as the diagram fills, so thousands of them shade the diagram instead of covering it. */
export function errorBarAlpha(count: number): number {
  return count > 2000 ? 0.18 : count > 300 ? 0.35 : 0.6;
}

export const AXIS_TITLES = {
  x: 'Effective temperature T (K), hotter to the left',
  y: 'Luminosity L (L☉)',
} as const;
