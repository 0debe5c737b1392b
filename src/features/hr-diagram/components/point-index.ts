/**
 * Nearest point to the pointer in a uniform grid of cells a few pixels wide:
 * a mouse move looks at the nine cells around the pointer instead of every
 * one of 10 000 points.
 */
export interface PointIndex<T> {
  nearest(x: number, y: number, maxDistance: number): T | null;
}

export function buildPointIndex<T extends { x: number; y: number }>(points: readonly T[], cell = 12): PointIndex<T> {
  const cells = new Map<number, T[]>();
  // Cell coordinates packed into one number; plots are far narrower than 65 536 cells.
  const key = (cx: number, cy: number) => cx * 65536 + cy;
  for (const p of points) {
    const k = key(Math.floor(p.x / cell), Math.floor(p.y / cell));
    const list = cells.get(k);
    if (list) list.push(p);
    else cells.set(k, [p]);
  }
  return {
    nearest(x, y, maxDistance) {
      const cx = Math.floor(x / cell);
      const cy = Math.floor(y / cell);
      const reach = Math.ceil(maxDistance / cell);
      let best: T | null = null;
      let bestD2 = maxDistance * maxDistance;
      for (let i = cx - reach; i <= cx + reach; i++) {
        for (let j = cy - reach; j <= cy + reach; j++) {
          const list = cells.get(key(i, j));
          if (!list) continue;
          for (const p of list) {
            const d2 = (p.x - x) ** 2 + (p.y - y) ** 2;
            if (d2 <= bestD2) {
              bestD2 = d2;
              best = p;
            }
          }
        }
      }
      return best;
    },
  };
}
