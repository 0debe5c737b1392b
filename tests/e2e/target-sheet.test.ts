import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { planckSpectralRadiance } from '../../shared/physics/planck';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/**
 * The finished target sheet in a real browser: its small HR diagram with the
 * star ringed and named, the cross-checks in words, and the spectrum chart
 * with our own legend and round, uncrowded ticks, by day, by night and in print.
 */

/** Tick labels of one axis must not overlap: each box ends before the next begins. */
async function ticksApart(page: Page, axis: 'x' | 'y'): Promise<{ count: number; overlaps: number }> {
  return page.evaluate((which) => {
    const selector = `[data-testid="spectrum-chart"] .recharts-${which === 'x' ? 'xAxis' : 'yAxis'}-tick-labels .recharts-cartesian-axis-tick-value`;
    const boxes = [...document.querySelectorAll(selector)].map((el) => el.getBoundingClientRect());
    boxes.sort((a, b) => (which === 'x' ? a.left - b.left : a.top - b.top));
    let overlaps = 0;
    for (let i = 1; i < boxes.length; i++) {
      if (which === 'x' ? boxes[i].left < boxes[i - 1].right : boxes[i].top < boxes[i - 1].bottom) overlaps++;
    }
    return { count: boxes.length, overlaps };
  }, axis);
}

async function openSheet(page: Page, baseUrl: string) {
  await page.goto(`${baseUrl}/projects/1/targets/1`);
  await page.getByRole('heading', { name: 'GW 101', level: 1 }).waitFor();
  await page.getByTestId('hr-mark').waitFor();
  // The chart draws its axes once it knows its width.
  await page.locator('[data-testid="spectrum-chart"] .recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value').first().waitFor();
}

describe.skipIf(!chromiumAvailable)('target sheet', () => {
  const { pageAs, baseUrl } = browserSuite();

  it('observer: commits a noisy spectrum of GW 101 for the sheet to show', async () => {
    const page = await pageAs('observer@demo.invalid');
    // A 5600 K blackbody, 380–920 nm every 2 nm, with ±4 % noise from a fixed Park–Miller generator (multiplier 16807), so the fit sits among the points.
    let seed = 7;
    const next = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const rows = ['wavelength,flux'];
    for (let nm = 380; nm <= 920; nm += 2) {
      rows.push(`${nm},${(planckSpectralRadiance(nm * 1e-9, 5600) * 1e-13 * (1 + 0.04 * (next() + next() + next() - 1.5))).toPrecision(6)}`);
    }
    await page.goto(`${baseUrl()}/projects/1/upload`);
    await page.getByRole('radio', { name: /Spectrum of one target/ }).check();
    await page.getByLabel('Target', { exact: true }).selectOption({ label: 'GW 101' });
    await page.getByLabel('Measurement file').setInputFiles({ name: 'gw101-spectrum.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await page.getByRole('button', { name: 'Upload and preview' }).click();
    await page.getByTestId('spectrum-chart').waitFor();
    await page.getByRole('button', { name: /Commit the spectrum fit|Commit the Planck temperature/ }).click();
    await page.getByTestId('commit-outcome').waitFor();
  });

  it('shows the star ringed on its small HR diagram, the cross-checks in words, and the spectrum with our legend (day theme)', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.setViewportSize({ width: 1366, height: 900 });
    await openSheet(page, baseUrl());
    expect(await page.getByTestId('hr-mark').textContent()).toBe('GW 101');
    expect(await page.getByTestId('hr-marked').textContent()).toMatch(/^Ringed: GW 101, T = [\d\s ]+ ± \d+ K, L = .+ L☉/);
    expect(await page.locator('canvas[role="img"]').getAttribute('aria-label')).toMatch(/GW 101 is marked at T = /);

    await page.getByRole('heading', { name: 'Cross-checks' }).waitFor();
    const checks = page.getByTestId('cross-checks').locator('li');
    expect(await checks.count()).toBeGreaterThan(0);
    const words = await page.getByTestId('cross-checks').innerText();
    // The demo's GW 101 has both distances and a settled class, so these two checks must be there.
    expect(words).toMatch(/The parallax and photometric distances (agree within 1 σ \([\d.]+ σ apart\)|differ by [\d.]+ σ)/);
    expect(words).toMatch(/A radius of [\d.]+ R☉ (fits|does not fit) a main-sequence star/);

    const legend = await page.getByTestId('spectrum-legend').innerText();
    expect(legend).toMatch(/Spectrum as sent, 271 points/);
    expect(legend).toMatch(/Planck fit, 5\d{3} ± \d+ K/);
    // Our legend, not the charting library's.
    expect(await page.locator('[data-testid="spectrum-chart"] .recharts-legend-wrapper').count()).toBe(0);
    const x = await ticksApart(page, 'x');
    expect(x.count).toBeGreaterThanOrEqual(3);
    expect(x.overlaps).toBe(0);
    const xLabels = await page.locator('[data-testid="spectrum-chart"] .recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value').allTextContents();
    // Round wavelengths: whole multiples of 1, 2 or 5 × 10ⁿ nm (here 50 or 100 nm apart).
    expect(xLabels.every((t) => Number(t) % 50 === 0)).toBe(true);
    expect((await ticksApart(page, 'y')).overlaps).toBe(0);
    await screenshot(page, 'target-sheet-day');
  });

  it('keeps the mark, the checks and uncrowded ticks at night on a phone, and prints in the print palette', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.evaluate(() => window.localStorage.setItem('starledger.theme', 'night'));
    await page.setViewportSize({ width: 390, height: 844 });
    await openSheet(page, baseUrl());
    expect(await page.getByTestId('hr-mark').textContent()).toBe('GW 101');
    await page.getByTestId('cross-checks').waitFor();
    const x = await ticksApart(page, 'x');
    expect(x.overlaps).toBe(0);
    expect(x.count).toBeLessThanOrEqual(4);
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await screenshot(page, 'target-sheet-night-390');

    await page.setViewportSize({ width: 1366, height: 900 });
    await page.emulateMedia({ media: 'print' });
    await page.getByTestId('hr-mark').waitFor();
    // Print takes the print tokens whatever the screen theme: the chart's fit line is the print brass on white paper.
    const colours = await page.evaluate(() => {
      const fit = document.querySelectorAll('[data-testid="spectrum-chart"] .recharts-line-curve');
      const last = fit[fit.length - 1] as SVGPathElement;
      return { fit: getComputedStyle(last).stroke, paper: getComputedStyle(document.documentElement).backgroundColor };
    });
    expect(colours.fit).toBe('rgb(133, 96, 28)');
    expect(colours.paper).toBe('rgb(255, 255, 255)');
    await page.getByTestId('cross-checks').waitFor();
    await screenshot(page, 'target-sheet-print');
  });
});
