/*
 * Axis ticks at round values: steps of 1, 2 or 5 × 10ⁿ, as few as the axis
 * has room for, so labels never run into each other on a phone.
 * @see P. S. Heckbert, "Nice numbers for graph labels", Graphics Gems (1990), pp. 61–63 (from memory)
 */

/** The smallest step of 1, 2 or 5 × 10ⁿ that is at least `rough`. */
export function niceStep(rough: number): number {
  if (!(rough > 0) || !Number.isFinite(rough)) return 1;
  const power = Math.pow(10, Math.floor(Math.log10(rough)));
  const fraction = rough / power;
  // A hair of tolerance: 0.2 / 0.1 is 2.0000000000000004 in floating point.
  const nice = fraction <= 1 + 1e-9 ? 1 : fraction <= 2 + 1e-9 ? 2 : fraction <= 5 + 1e-9 ? 5 : 10;
  return nice * power;
}

/**
 * Round ticks inside [min, max], at most `maxCount` of them (at least two
 * when the range allows), each a whole multiple of the step.
 */
export function niceTicks(min: number, max: number, maxCount: number): { step: number; ticks: number[] } {
  if (!Number.isFinite(min) || !Number.isFinite(max) || max <= min) return { step: 1, ticks: Number.isFinite(min) ? [min] : [] };
  const count = Math.max(2, Math.floor(maxCount));
  let step = niceStep((max - min) / count);
  // A step that still gives too many ticks (the rounding went down) moves to the next round value.
  while (Math.floor(max / step + 1e-9) - Math.ceil(min / step - 1e-9) + 1 > count) step = niceStep(step * 1.0001 + Number.EPSILON);
  const ticks: number[] = [];
  for (let k = Math.ceil(min / step - 1e-9); k <= Math.floor(max / step + 1e-9); k++) {
    // k × step, rounded to the step's own decimals so 0.1 × 3 prints as 0.3.
    const decimals = Math.max(0, -Math.floor(Math.log10(step)));
    ticks.push(Number((k * step).toFixed(Math.min(20, decimals))));
  }
  return { step, ticks };
}

/** How many labels of about `labelPx` fit along `lengthPx` with a gap between them. */
export function tickRoom(lengthPx: number, labelPx: number): number {
  return Math.max(2, Math.floor(lengthPx / (labelPx * 1.6)));
}
