import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/**
 * The HR diagram of the demo project in a real browser: the first star
 * answers the pointer with its values, a click opens its sheet, the night
 * theme's canvas gives off red light only, readers get no choice of
 * proposed values, the keyboard list links every star, and the SVG saved is
 * the same drawing.
 */
interface FirstDraw {
  x: number;
  y: number;
  designation: string;
  count: number;
}

async function openDiagram(page: Page, baseUrl: string): Promise<FirstDraw> {
  await page.goto(`${baseUrl}/projects/1/hr`);
  await page.waitForFunction(() => performance.getEntriesByName('hr:first-draw').length > 0);
  return page.evaluate(() => (performance.getEntriesByName('hr:first-draw')[0] as PerformanceMark).detail as FirstDraw);
}

describe.skipIf(!chromiumAvailable)('HR diagram page', () => {
  const { pageAs, baseUrl } = browserSuite();

  it('shows a star’s values on hover and opens its sheet on click (day theme)', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.setViewportSize({ width: 1366, height: 900 });
    const first = await openDiagram(page, baseUrl());
    expect(first.count).toBeGreaterThan(0);
    const box = (await page.locator('canvas[role="img"]').boundingBox())!;
    await page.mouse.move(box.x + first.x, box.y + first.y);
    const tip = page.locator('[data-hr-tooltip]');
    await tip.waitFor();
    const text = await tip.innerText();
    expect(text).toContain(first.designation);
    expect(text).toMatch(/T = [\d\s ]+ ± \d+ K/);
    expect(text).toMatch(/L☉/);
    expect(text).toMatch(/approved|proposed/);
    await screenshot(page, 'hr-diagram-day');
    const png = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Save PNG' }).click();
    // The PNG signature (ISO/IEC 15948): \x89 P N G \r \n \x1a \n.
    expect(fs.readFileSync(await (await png).path()).subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
    await page.getByLabel('Luminosity class').selectOption('white_dwarf');
    await page.getByText(/^0 stars on the diagram|^\d+ stars? on the diagram.*white dwarf/).waitFor();
    await page.getByLabel('Luminosity class').selectOption('');
    await page.getByText(`${first.count} stars on the diagram`, { exact: false }).waitFor();
    await page.mouse.click(box.x + first.x, box.y + first.y);
    await page.waitForURL(/\/projects\/1\/targets\/\d+$/);
    await page.getByRole('heading', { name: first.designation, level: 1 }).waitFor();
  });

  it('draws in red light only in the night theme', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.evaluate(() => window.localStorage.setItem('starledger.theme', 'night'));
    await openDiagram(page, baseUrl());
    const notRed = await page.evaluate(() => {
      const canvas = document.querySelector('canvas[role="img"]') as HTMLCanvasElement;
      const data = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height).data;
      let count = 0;
      for (let i = 0; i < data.length; i += 4) if (data[i + 1] !== 0 || data[i + 2] !== 0) count++;
      return count;
    });
    expect(notRed).toBe(0);
    await screenshot(page, 'hr-diagram-night');
  });

  it('offers a reader no proposed values, links every star from the keyboard list, and saves the same drawing as SVG', async () => {
    const page = await pageAs('reader@demo.invalid');
    const first = await openDiagram(page, baseUrl());
    expect(await page.getByLabel('Values', { exact: true }).count()).toBe(0);
    await page.getByText(/^Stars on the diagram/).click();
    // The list is drawn when it opens: wait for it before counting.
    await page.getByRole('link', { name: first.designation, exact: true }).waitFor();
    const links = page.locator('details table a');
    expect(await links.count()).toBe(first.count);
    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Save SVG' }).click();
    const file = await (await download).path();
    const svg = fs.readFileSync(file, 'utf8');
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.match(/<circle /g)?.length).toBe(first.count);
    expect(svg).toContain(`<title>${first.designation}</title>`);
  });
});
