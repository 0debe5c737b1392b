import { Cron } from 'croner';
import type { SummarySchedule } from '../../../shared/schemas/mail';

/** The calendar date of an instant in a time zone. */
function localDate(at: Date, timeZone: string): { year: number; month: number; day: number } {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(at);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  return { year: get('year'), month: get('month'), day: get('day') };
}

/**
 * The ISO 8601 week ("2026-W49") of an instant as the calendar reads in the
 * given time zone: weeks start on Monday and week 1 holds the year's first
 * Thursday.
 * @see ISO 8601-1:2019 §5.2.4 (week dates), from memory
 */
export function isoWeek(at: Date, timeZone: string): string {
  const { year, month, day } = localDate(at, timeZone);
  const date = new Date(Date.UTC(year, month - 1, day));
  const weekday = date.getUTCDay() || 7;
  // The Thursday of this week decides the week's year.
  date.setUTCDate(date.getUTCDate() + 4 - weekday);
  const weekYear = date.getUTCFullYear();
  const week = Math.ceil(((date.getTime() - Date.UTC(weekYear, 0, 1)) / 86_400_000 + 1) / 7);
  return `${weekYear}-W${String(week).padStart(2, '0')}`;
}

function cronOf(schedule: SummarySchedule, timeZone: string): Cron {
  const [hour, minute] = schedule.time.split(':').map(Number);
  return new Cron(`${minute} ${hour} * * ${schedule.weekday}`, { timezone: timeZone, paused: true });
}

/** The next scheduled sending after `after`, or null when the summary is off. */
export function nextSummaryRun(schedule: SummarySchedule, timeZone: string, after: Date): Date | null {
  if (!schedule.enabled) return null;
  return cronOf(schedule, timeZone).nextRun(after);
}

/** The latest scheduled sending at or before `at` (null when the summary is off). */
export function lastSummaryRun(schedule: SummarySchedule, timeZone: string, at: Date): Date | null {
  if (!schedule.enabled) return null;
  return cronOf(schedule, timeZone).previousRuns(1, new Date(at.getTime() + 1000))[0] ?? null;
}
