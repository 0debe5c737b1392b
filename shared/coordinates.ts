/**
 * Equatorial coordinates (J2000) as typed by observers: sexagesimal in the
 * common spellings (`05 14 32.3`, `05:14:32.3`, `5h14m32.3s`, `-08 12 05`,
 * `-8d12m05s`, `-08°12′05″`) or decimal degrees (`78.6346`).
 *
 * Right ascension in sexagesimal is in hours; a bare decimal number is
 * degrees for both axes (the convention of most catalogues' machine-readable
 * columns). The true minus sign (U+2212), which the sheets print, reads
 * like a hyphen. Results are degrees. Errors name the field and the limit.
 */

export type CoordinateResult = { ok: true; degrees: number } | { ok: false; message: string };

const SEXAGESIMAL = /^([+\-−])?\s*(\d{1,3})\s*(?:[:\sdh°]|\s+)\s*(\d{1,2})\s*(?:[:\sm'′]|\s+)\s*(\d{1,2}(?:\.\d*)?)\s*(?:s|"|″|'')?$/i;
const DECIMAL = /^[+\-−]?(?:\d+\.?\d*|\.\d+)(?:\s*(?:°|d|deg))?$/i;

function parseSexagesimal(text: string): { sign: number; a: number; b: number; c: number } | null {
  const m = SEXAGESIMAL.exec(text.trim());
  if (!m) return null;
  return { sign: m[1] === '-' || m[1] === '−' ? -1 : 1, a: Number(m[2]), b: Number(m[3]), c: Number(m[4]) };
}

/** Right ascension, J2000. Sexagesimal is hours (0–24 h); decimal is degrees (0–360°). */
export function parseRightAscension(input: string | number): CoordinateResult {
  if (typeof input === 'number') return checkRaDegrees(input);
  const text = input.trim();
  if (text === '') return { ok: false, message: 'Right ascension is empty.' };
  const sx = parseSexagesimal(text);
  if (sx) {
    if (sx.sign < 0) return { ok: false, message: 'Right ascension cannot be negative.' };
    if (sx.a >= 24) return { ok: false, message: `Right ascension hours must be 0–23 (got ${sx.a}).` };
    if (sx.b >= 60) return { ok: false, message: `Right ascension minutes must be 0–59 (got ${sx.b}).` };
    if (sx.c >= 60) return { ok: false, message: `Right ascension seconds must be below 60 (got ${sx.c}).` };
    return { ok: true, degrees: (sx.a + sx.b / 60 + sx.c / 3600) * 15 };
  }
  if (DECIMAL.test(text)) return checkRaDegrees(Number.parseFloat(text.replace('−', '-')));
  return { ok: false, message: `Right ascension "${text}" is not sexagesimal (05 14 32.3, 05:14:32.3, 5h14m32.3s) or decimal degrees.` };
}

function checkRaDegrees(deg: number): CoordinateResult {
  if (!Number.isFinite(deg)) return { ok: false, message: 'Right ascension is not a number.' };
  if (deg < 0 || deg >= 360) return { ok: false, message: `Right ascension must be 0–360° (got ${deg}).` };
  return { ok: true, degrees: deg };
}

/** Declination, J2000, −90° to +90°, sexagesimal degrees or decimal degrees. */
export function parseDeclination(input: string | number): CoordinateResult {
  if (typeof input === 'number') return checkDecDegrees(input);
  const text = input.trim();
  if (text === '') return { ok: false, message: 'Declination is empty.' };
  const sx = parseSexagesimal(text);
  if (sx) {
    if (sx.b >= 60) return { ok: false, message: `Declination arcminutes must be 0–59 (got ${sx.b}).` };
    if (sx.c >= 60) return { ok: false, message: `Declination arcseconds must be below 60 (got ${sx.c}).` };
    return checkDecDegrees(sx.sign * (sx.a + sx.b / 60 + sx.c / 3600));
  }
  if (DECIMAL.test(text)) return checkDecDegrees(Number.parseFloat(text.replace('−', '-')));
  return { ok: false, message: `Declination "${text}" is not sexagesimal (-08 12 05, -08:12:05, -8d12m05s) or decimal degrees.` };
}

function checkDecDegrees(deg: number): CoordinateResult {
  if (!Number.isFinite(deg)) return { ok: false, message: 'Declination is not a number.' };
  if (deg < -90 || deg > 90) return { ok: false, message: `Declination must be between −90° and +90° (got ${deg}).` };
  return { ok: true, degrees: deg };
}

function pad(n: number, width: number, decimals = 0): string {
  const s = n.toFixed(decimals);
  const [int] = s.split('.');
  return '0'.repeat(Math.max(0, width - int.length)) + s;
}

/** Degrees → `hh mm ss.ss` (hours). */
export function formatRightAscension(deg: number): string {
  let totalSeconds = Math.round((deg / 15) * 3600 * 100) / 100;
  if (totalSeconds >= 86400) totalSeconds -= 86400;
  const h = Math.floor(totalSeconds / 3600);
  const m = Math.floor((totalSeconds - h * 3600) / 60);
  const s = totalSeconds - h * 3600 - m * 60;
  return `${pad(h, 2)} ${pad(m, 2)} ${pad(s, 2, 2)}`;
}

/** Degrees → `±dd mm ss.s`. */
export function formatDeclination(deg: number): string {
  const sign = deg < 0 ? '−' : '+';
  const totalSeconds = Math.round(Math.abs(deg) * 3600 * 10) / 10;
  const d = Math.floor(totalSeconds / 3600);
  const m = Math.floor((totalSeconds - d * 3600) / 60);
  const s = totalSeconds - d * 3600 - m * 60;
  return `${sign}${pad(d, 2)} ${pad(m, 2)} ${pad(s, 2, 1)}`;
}

/**
 * Designations are matched case- and space-insensitively (PRODUCT.md):
 * `SLR  12a` and `slr12A` are the same target.
 */
export function designationKey(designation: string): string {
  return designation.replace(/\s+/g, '').toLowerCase();
}
