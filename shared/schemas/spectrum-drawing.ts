/**
 * How many of a spectrum's points travel to the browser to be drawn. A
 * chart at most a screen wide cannot show more than about 1500; a spectrum
 * of 600 000 points sent whole was a 16 MB answer for one preview. The
 * server keeps and fits every point (the stored preview, the spectra
 * table); what it answers is every n-th point, with the full count beside
 * them so the page can say how many there are and how many are drawn.
 */
export const MOST_POINTS_DRAWN = 1500;

/** Every n-th point, n the smallest stride that leaves at most MOST_POINTS_DRAWN; the first point always kept. */
export function pointsToDraw<P>(points: readonly P[]): P[] {
  const stride = Math.max(1, Math.ceil(points.length / MOST_POINTS_DRAWN));
  return stride === 1 ? [...points] : points.filter((_, i) => i % stride === 0);
}
