import { describe, expect, it } from 'vitest';
import { isoWeek, lastSummaryRun, nextSummaryRun } from '../../../server/modules/summary/summary-schedule';
import { retryDelayMs } from '../../../server/mail/outbox-worker';

describe('isoWeek', () => {
  // ISO 8601 week dates, from memory: 1 Jan 2021 (a Friday) and 3 Jan 2021 belong to 2020-W53; 4 Jan 2021 is 2021-W01;
  // 29 Dec 2025 (a Monday) begins 2026-W01, because 1 Jan 2026 is a Thursday; 31 Dec 2026 (a Thursday) is in 2026-W53.
  it.each([
    ['2021-01-01T12:00:00Z', '2020-W53'],
    ['2021-01-03T12:00:00Z', '2020-W53'],
    ['2021-01-04T12:00:00Z', '2021-W01'],
    ['2025-12-29T12:00:00Z', '2026-W01'],
    ['2026-12-31T12:00:00Z', '2026-W53'],
    ['2026-12-02T12:00:00Z', '2026-W49'],
  ])('%s is in %s (UTC)', (iso, week) => {
    expect(isoWeek(new Date(iso), 'Etc/UTC')).toBe(week);
  });

  it('reads the calendar of the site: Sunday 23:30 UTC is already Monday in Johannesburg (UTC+2)', () => {
    expect(isoWeek(new Date('2026-11-29T23:30:00Z'), 'Etc/UTC')).toBe('2026-W48');
    expect(isoWeek(new Date('2026-11-29T23:30:00Z'), 'Africa/Johannesburg')).toBe('2026-W49');
  });
});

describe('the summary schedule', () => {
  const monday8 = { enabled: true, weekday: 1, time: '08:00' };

  it('runs at the local time in the site’s zone, across a change of daylight saving time', () => {
    // Europe/Berlin is UTC+1 in winter and UTC+2 from the last Sunday of March (EU rule, from memory).
    expect(nextSummaryRun(monday8, 'Europe/Berlin', new Date('2026-03-25T00:00:00Z'))?.toISOString()).toBe('2026-03-30T06:00:00.000Z');
    expect(nextSummaryRun(monday8, 'Europe/Berlin', new Date('2026-03-18T00:00:00Z'))?.toISOString()).toBe('2026-03-23T07:00:00.000Z');
  });

  it('finds the latest run at or before a moment, and none when the summary is off', () => {
    expect(lastSummaryRun(monday8, 'Etc/UTC', new Date('2026-12-07T08:00:00Z'))?.toISOString()).toBe('2026-12-07T08:00:00.000Z');
    expect(lastSummaryRun(monday8, 'Etc/UTC', new Date('2026-12-07T07:59:59Z'))?.toISOString()).toBe('2026-11-30T08:00:00.000Z');
    expect(lastSummaryRun({ ...monday8, enabled: false }, 'Etc/UTC', new Date('2026-12-07T09:00:00Z'))).toBeNull();
    expect(nextSummaryRun({ ...monday8, enabled: false }, 'Etc/UTC', new Date('2026-12-07T09:00:00Z'))).toBeNull();
  });
});

describe('retryDelayMs', () => {
  it('doubles from the base after each failure and stops at the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8].map((n) => retryDelayMs(n, 30_000, 3_600_000))).toEqual([30_000, 60_000, 120_000, 240_000, 480_000, 960_000, 1_920_000, 3_600_000]);
  });
});
