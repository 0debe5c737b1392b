/**
 * Where the Sun is on a date, and whether a target lies close to it, so the
 * target sheet and the upload preview can warn observers before anyone
 * points an instrument near it.
 *
 * Low-precision solar coordinates, good to about 0.01° between 1950 and 2050:
 * the Astronomical Almanac's "Low precision formulas for the Sun" (section C),
 * quoted from memory. Ample for a safety warning with a margin of degrees.
 */

const DEG = Math.PI / 180;

/** Julian date of a JavaScript Date (UTC). JD 2440587.5 is 1970-01-01T00:00Z. */
export function julianDate(date: Date): number {
  return date.getTime() / 86_400_000 + 2_440_587.5;
}

/** Apparent right ascension and declination of the Sun, degrees (equinox of date; the J2000 difference is far below the warning margin). */
export function sunPosition(date: Date): { raDeg: number; decDeg: number } {
  const n = julianDate(date) - 2_451_545.0;
  const meanLongitude = 280.46 + 0.9856474 * n;
  const meanAnomaly = (357.528 + 0.9856003 * n) * DEG;
  const eclipticLongitude = (meanLongitude + 1.915 * Math.sin(meanAnomaly) + 0.02 * Math.sin(2 * meanAnomaly)) * DEG;
  const obliquity = (23.439 - 0.0000004 * n) * DEG;
  const ra = Math.atan2(Math.cos(obliquity) * Math.sin(eclipticLongitude), Math.cos(eclipticLongitude));
  const dec = Math.asin(Math.sin(obliquity) * Math.sin(eclipticLongitude));
  return { raDeg: ((ra / DEG) % 360 + 360) % 360, decDeg: dec / DEG };
}

/** Great-circle separation of two positions, degrees (haversine form, stable at small angles). */
export function angularSeparationDeg(ra1Deg: number, dec1Deg: number, ra2Deg: number, dec2Deg: number): number {
  const dRa = (ra2Deg - ra1Deg) * DEG;
  const dDec = (dec2Deg - dec1Deg) * DEG;
  const a = Math.sin(dDec / 2) ** 2 + Math.cos(dec1Deg * DEG) * Math.cos(dec2Deg * DEG) * Math.sin(dRa / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(a)))) / DEG;
}

/**
 * Within this many degrees of the Sun a target is flagged. Common practice
 * for small telescopes without solar filters is to keep well clear of the
 * Sun; 15° is the margin Starledger uses, not a published standard.
 */
export const SUN_CAUTION_RADIUS_DEG = 15;

const SUN_NAMES = new Set(['sun', 'sol', 'thesun']);

export interface SunCaution {
  reason: 'is_sun' | 'near_sun';
  separationDeg?: number;
  message: string;
}

export const SOLAR_SAFETY_TEXT =
  'Never point a telescope, finder or camera at the Sun without a certified full-aperture solar filter: it blinds in an instant. Follow your observatory’s safety rules.';

/** A caution when the target is the Sun or lies within SUN_CAUTION_RADIUS_DEG of it at `date`; null otherwise. */
export function sunCaution(target: { designation: string; raDeg?: number; decDeg?: number }, date: Date | null): SunCaution | null {
  if (SUN_NAMES.has(target.designation.replace(/\s+/g, '').toLowerCase())) {
    return { reason: 'is_sun', message: `This target is the Sun. ${SOLAR_SAFETY_TEXT}` };
  }
  if (!date || target.raDeg === undefined || target.decDeg === undefined) return null;
  const sun = sunPosition(date);
  const separationDeg = angularSeparationDeg(target.raDeg, target.decDeg, sun.raDeg, sun.decDeg);
  if (separationDeg > SUN_CAUTION_RADIUS_DEG) return null;
  return {
    reason: 'near_sun',
    separationDeg,
    message: `On ${date.toISOString().slice(0, 10)} this target is ${separationDeg.toFixed(1)}° from the Sun. ${SOLAR_SAFETY_TEXT}`,
  };
}
