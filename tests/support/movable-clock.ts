import type { Clock } from '../../server/lib/clock';

/** A clock the test moves, as an attacker who waits out each delay would see time pass. */
export function movableClock(iso = '2026-12-01T03:00:00.000Z'): Clock & { advance(ms: number): void } {
  let t = Date.parse(iso);
  return { now: () => new Date(t), advance: (ms: number) => void (t += ms) };
}
