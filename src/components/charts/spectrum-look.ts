/*
 * What the spectrum chart's two halves share: the words and figures around
 * the plot (spectrum-chart.tsx, loaded with the page) and the plot itself
 * (spectrum-plot.tsx, which brings the charting library and is loaded only
 * when a spectrum is drawn).
 */

/*
 * The chart's look is the theme's own: the data as small dots in the soft ink,
 * the fit as a brass line on a halo of paper drawn over them, the peak in the
 * alert colour. Every colour is a theme token, so the night theme stays red
 * and print takes the print tokens.
 */
export const PALETTE = {
  points: 'var(--sl-ink-soft)',
  fit: 'var(--sl-brass)',
  halo: 'var(--sl-paper)',
  peak: 'var(--sl-alert)',
  grid: 'var(--sl-rule)',
  axis: 'var(--sl-ink-soft)',
  text: 'var(--sl-ink)',
  /** The points are drawn fainter than the fit: in the night theme every token is the same red, and brightness is what tells them apart. */
  pointsOpacity: 0.55,
} as const;

/** The plot's height in px: the page keeps this room for it while the plot loads, so nothing below moves. */
export const CHART_HEIGHT = 320;

/** One drawn point: wavelength in nm, the flux as sent, the fitted curve there. */
export type Point = { nm: number; flux: number; fit: number | undefined };

