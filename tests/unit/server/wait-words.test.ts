import { describe, expect, it } from 'vitest';
import { waitWords } from '../../../server/lib/errors';

describe('a wait in words, as a 429 states it', () => {
  it('rounds up to the unit people count in, and never says "60 minutes"', () => {
    // Worked by hand: seconds below a minute, whole minutes (rounded up) below an hour, then hours.
    const cases: [number, string][] = [
      [1, '1 second'],
      [59, '59 seconds'],
      [60, '1 minute'],
      [64, '2 minutes'],
      [900, '15 minutes'],
      [3540, '59 minutes'],
      [3541, '1 hour'],
      [3600, '1 hour'],
    ];
    expect(cases.map(([s]) => waitWords(s))).toEqual(cases.map(([, words]) => words));
  });
});
