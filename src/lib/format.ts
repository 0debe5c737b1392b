/**
 * Display formats shared by every page. Times are shown in UTC because an
 * observing log is kept in UTC, whatever the browser's zone.
 */

const dateTime = new Intl.DateTimeFormat('en-GB', {
  timeZone: 'UTC',
  year: 'numeric',
  month: '2-digit',
  day: '2-digit',
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
});

/** ISO timestamp → `2026-11-30 21:14 UTC`. */
export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const parts = Object.fromEntries(dateTime.formatToParts(date).map((p) => [p.type, p.value]));
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute} UTC`;
}

/** ISO timestamp → `2026-11-30` (UTC). */
export function formatDate(iso: string): string {
  return formatDateTime(iso).slice(0, 10);
}

function trimNumber(value: number, decimals: number): string {
  return value.toFixed(decimals).replace('-', '−');
}

/** Latitude in degrees → `24.6270° S`. */
export function formatLatitude(deg: number): string {
  return `${trimNumber(Math.abs(deg), 4)}° ${deg < 0 ? 'S' : 'N'}`;
}

/** Longitude in degrees (east positive) → `70.4040° W`. */
export function formatLongitude(deg: number): string {
  return `${trimNumber(Math.abs(deg), 4)}° ${deg < 0 ? 'W' : 'E'}`;
}

/** Metres above sea level → `2 635 m`. */
export function formatElevation(metres: number): string {
  return `${new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 }).format(metres).replace(/,/g, '\u2009')} m`;
}

/** Decimal degrees with a fixed number of places and a true minus sign. */
export function formatDegrees(deg: number, decimals = 5): string {
  return `${trimNumber(deg, decimals)}°`;
}

export function formatCount(n: number, singular: string, plural = `${singular}s`): string {
  return `${new Intl.NumberFormat('en-GB').format(n)} ${n === 1 ? singular : plural}`;
}
