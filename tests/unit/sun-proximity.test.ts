import { describe, expect, it } from 'vitest';
import { angularSeparationDeg, julianDate, sunCaution, sunPosition } from '../../shared/sun-proximity';

describe('solar position', () => {
  it('J2000.0 is JD 2451545.0 (IAU definition of the epoch: 2000 January 1, 12h TT; UTC differs by ~64 s)', () => {
    expect(julianDate(new Date('2000-01-01T12:00:00Z'))).toBe(2451545.0);
  });

  it('puts the Sun on the equator at the March equinox', () => {
    // March equinox 2024: 2024-03-20 03:06 UTC (published almanac time, from memory).
    const { raDeg, decDeg } = sunPosition(new Date('2024-03-20T03:06:00Z'));
    expect(Math.abs(decDeg)).toBeLessThan(0.05);
    expect(Math.min(raDeg, 360 - raDeg)).toBeLessThan(0.1);
  });

  it('puts the Sun at the obliquity (23.44°) at the June solstice', () => {
    // June solstice 2024: 2024-06-20 20:51 UTC (from memory); obliquity 23.439° (IAU 2006, J2000).
    const { raDeg, decDeg } = sunPosition(new Date('2024-06-20T20:51:00Z'));
    expect(decDeg).toBeCloseTo(23.44, 1);
    expect(raDeg).toBeCloseTo(90, 0);
  });
});

describe('angular separation', () => {
  it('is 90° from pole to equator and 0 for the same point', () => {
    expect(angularSeparationDeg(10, 90, 200, 0)).toBeCloseTo(90, 9);
    expect(angularSeparationDeg(123.4, -5.6, 123.4, -5.6)).toBe(0);
  });
});

describe('sun caution', () => {
  it('flags the Sun by name whatever the spacing and case', () => {
    expect(sunCaution({ designation: ' the  SUN ' }, null)?.reason).toBe('is_sun');
  });
  it('flags a target near the Sun on the date and not six months later', () => {
    const equinox = new Date('2024-03-20T03:06:00Z');
    expect(sunCaution({ designation: 'X', raDeg: 5, decDeg: 2 }, equinox)?.reason).toBe('near_sun');
    expect(sunCaution({ designation: 'X', raDeg: 5, decDeg: 2 }, new Date('2024-09-22T12:00:00Z'))).toBeNull();
  });
});

describe('solar position against an independent reference library', () => {
  it('agrees with astronomy-engine (apparent, equinox of date) within 0.02° from 2000 to 2040', async () => {
    const { Body, Equator, Observer } = await import('astronomy-engine');
    const geocentre = new Observer(0, 0, 0);
    for (let day = 0; day < 40 * 365.25; day += 97.3) {
      const date = new Date(Date.UTC(2000, 0, 1) + day * 86_400_000);
      const ref = Equator(Body.Sun, date, geocentre, true, true);
      const ours = sunPosition(date);
      // The almanac's low-precision formula is good to about 0.01° (Astronomical Almanac, section C; from memory).
      expect(angularSeparationDeg(ours.raDeg, ours.decDeg, ref.ra * 15, ref.dec), date.toISOString()).toBeLessThan(0.02);
    }
  });
});
