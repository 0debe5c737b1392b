import { describe, expect, it } from 'vitest';
import { summariseDraws } from '../../../shared/physics/monte-carlo';
import { normalDeviates } from '../../support/reference-random';

/**
 * The percentile rule numpy.percentile uses by default ("linear", Hyndman &
 * Fan 1996 type 7: position p (n − 1) between the order statistics), written
 * here from the definition with a full sort, as the reference for the
 * engine's selection.
 */
function type7(values: number[], p: number): number {
  const sorted = values.filter(Number.isFinite).sort((a, b) => a - b);
  const at = p * (sorted.length - 1);
  const k = Math.floor(at);
  const next = Math.min(k + 1, sorted.length - 1);
  return sorted[k] + (sorted[next] - sorted[k]) * (at - k);
}

const P_LOW = 0.158655; // Φ(−1)
const P_HIGH = 0.841345; // Φ(+1)

function check(values: number[]): void {
  const draws = Float64Array.from(values);
  const before = Float64Array.from(draws);
  const s = summariseDraws(draws, new Float64Array(draws.length), 'x');
  expect(s.low).toBe(type7(values, P_LOW));
  expect(s.high).toBe(type7(values, P_HIGH));
  expect(s.accepted).toBe(values.filter(Number.isFinite).length);
  expect(draws).toEqual(before);
}

describe('the central 68 % interval of Monte Carlo draws (type 7 percentiles, Hyndman & Fan 1996)', () => {
  it('equals a full sort to the last bit for normal, skewed, sorted, reversed, tied and partly refused draws', () => {
    const z = normalDeviates(7);
    for (const n of [60, 399, 400, 1000, 1001, 5000]) {
      const normal = Array.from({ length: n }, () => 10 + 3 * z());
      check(normal);
      check(normal.map((x) => 1 / x)); // skewed: a distance from a parallax
      check([...normal].sort((a, b) => a - b)); // sorted: the evenly spaced sample sees every rank
      check([...normal].sort((a, b) => b - a));
      check(normal.map((x) => Math.round(x))); // many ties
      check(normal.map((x, i) => (i % 9 === 0 ? Number.NaN : i % 23 === 0 ? Infinity : x)));
      check(Array.from({ length: n }, (_, i) => (i < n / 2 ? 0 : 1))); // two values only
    }
  });

  it('refuses fewer than 50 finite draws', () => {
    const draws = Float64Array.from({ length: 1000 }, (_, i) => (i < 40 ? i : Number.NaN));
    expect(() => summariseDraws(draws, new Float64Array(1000), 'distance')).toThrow(/only 40 of 1000/);
  });
});
