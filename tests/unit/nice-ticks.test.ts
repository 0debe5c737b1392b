import { describe, expect, it } from 'vitest';
import { niceStep, niceTicks, tickRoom } from '@/components/charts/nice-ticks';

// Round steps are 1, 2 or 5 × 10ⁿ (Heckbert, Graphics Gems 1990); every expectation below is worked by hand.
describe('nice ticks', () => {
  it('rounds a rough step up to 1, 2 or 5 × 10ⁿ', () => {
    expect(niceStep(0.7)).toBe(1);
    expect(niceStep(1.3)).toBe(2);
    expect(niceStep(37)).toBe(50);
    expect(niceStep(600)).toBe(1000);
    expect(niceStep(0.02)).toBeCloseTo(0.02, 15);
  });

  it('puts ticks of a 380–920 nm spectrum at round wavelengths, fewer on a narrow chart', () => {
    // 540 nm / 8 = 67.5 → step 100: 400 … 900.
    expect(niceTicks(380, 920, 8).ticks).toEqual([400, 500, 600, 700, 800, 900]);
    // 540 / 3 = 180 → 200: 400, 600, 800.
    expect(niceTicks(380, 920, 3).ticks).toEqual([400, 600, 800]);
  });

  it('never gives more ticks than asked, and every tick is a whole multiple of the step', () => {
    for (const [min, max] of [
      [350, 1000],
      [0, 1],
      [0.013, 0.97],
      [-3.2e-14, 7.9e-13],
      [412.5, 413.1],
    ]) {
      for (let count = 2; count <= 12; count++) {
        const { step, ticks } = niceTicks(min, max, count);
        expect(ticks.length).toBeLessThanOrEqual(count);
        expect(ticks.length).toBeGreaterThanOrEqual(1);
        for (const t of ticks) {
          expect(t).toBeGreaterThanOrEqual(min - step * 1e-9);
          expect(t).toBeLessThanOrEqual(max + step * 1e-9);
          expect(Math.abs(t / step - Math.round(t / step))).toBeLessThan(1e-6);
        }
        const mantissa = step / Math.pow(10, Math.floor(Math.log10(step) + 1e-12));
        expect([1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
      }
    }
  });

  it('prints decimal ticks without floating-point tails', () => {
    expect(niceTicks(0, 1, 6).ticks).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  it('leaves room between labels: 300 px holds 4 labels of 44 px, 1000 px holds 14', () => {
    // floor(300 / (44 × 1.6)) = floor(4.26) = 4; floor(1000 / 70.4) = 14.
    expect(tickRoom(300, 44)).toBe(4);
    expect(tickRoom(1000, 44)).toBe(14);
  });
});
