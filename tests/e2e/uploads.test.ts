import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { planckSpectralRadiance } from '../../shared/physics/planck';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, screenshot, shotsDir } from './support/harness';

const SAMPLE = path.resolve(import.meta.dirname, '../../public/samples/glasswing-night.csv');

/** A night's file from the observer's computer to proposed values on a target sheet, in Chromium against the production build. */
describe.skipIf(!chromiumAvailable)('measurement uploads in the browser', () => {
  const { baseUrl, pageAs } = browserSuite();


  async function openProject(page: Page) {
    await page.getByRole('link', { name: /Glasswing Nearby Dwarfs Programme/ }).first().click();
    await page.getByRole('link', { name: 'GW 101', exact: true }).waitFor();
  }

  it('observer: uploads the sample night, commits it, and reads the proposed values on the target sheet', async () => {
    const page = await pageAs('observer@demo.invalid');
    await openProject(page);
    await page.getByRole('navigation', { name: 'Project' }).getByRole('link', { name: 'Upload', exact: true }).click();
    await page.getByRole('heading', { name: 'Upload measurements' }).waitFor();
    expect(await page.getByRole('link', { name: 'sample file' }).getAttribute('href')).toBe('/samples/glasswing-night.csv');
    expect(await page.getByRole('link', { name: /Long template/ }).getAttribute('href')).toMatch(/\/uploads\/templates\/long\.csv$/);

    await page.getByLabel('Measurement file').setInputFiles(SAMPLE);
    await page.getByTestId('chosen-file').waitFor();
    await screenshot(page, 'uploads-01-file-chosen');
    await page.getByRole('button', { name: 'Upload and preview' }).click();
    await page.waitForURL(/\/projects\/\d+\/uploads\/\d+$/);
    const uploadId = page.url().split('/').pop();
    await page.getByTestId('preview-table').waitFor();
    expect(await page.getByTestId('upload-status').textContent()).toBe('Previewed, not imported');
    expect(await page.locator('[data-testid="preview-table"] tbody tr').count()).toBe(20);
    expect(await page.locator('[data-error="true"]').count()).toBe(0);
    await screenshot(page, 'uploads-02-preview');

    await page.getByRole('button', { name: 'Commit all 20 measurements' }).click();
    const outcome = page.getByTestId('commit-outcome');
    await outcome.waitFor();
    expect(await outcome.textContent()).toContain('20 measurements added');
    await page.getByTestId('upload-targets').getByRole('link', { name: 'GW 101' }).waitFor();
    await screenshot(page, 'uploads-03-committed');

    await page.getByTestId('upload-targets').getByRole('link', { name: 'GW 101' }).click();
    await page.getByRole('heading', { name: 'GW 101' }).waitFor();
    // GW 101's temperature was approved in the demo; the night's new one stands beside it as a proposal.
    const adopted = page.locator('[data-quantity="temperature"][data-status="proposed"]').first();
    await adopted.waitFor();
    expect(await adopted.textContent()).toMatch(/\d+ ± \d+ K/);
    expect(await adopted.getByTestId('derived-status').textContent()).toBe('Proposed');
    expect(await page.locator('[data-quantity="distance_parallax"]').first().textContent()).toContain('pc');
    await page.getByText('Derived values are estimates from simple models.').waitFor();
    // The sample has seven rows for GW 101; the demo season may have brought others before it.
    await page.getByTestId('measurements-table').waitFor();
    expect(await page.getByTestId('measurements-table').getByRole('link', { name: `Upload ${uploadId}`, exact: true }).count()).toBe(7);
    await screenshot(page, 'uploads-04-target-sheet');
  });

  it('observer: commits a spectrum and finds it plotted with its Planck fit on the target sheet', async () => {
    const page = await pageAs('observer@demo.invalid');
    // A 5200 K blackbody, 350–1000 nm, peak inside the range (Wien: 2.897771955e-3 m K / 5200 K ≈ 557 nm, CODATA 2018 b); no flux uncertainties.
    const rows = ['wavelength,flux'];
    for (let nm = 350; nm <= 1000; nm += 5) rows.push(`${nm},${(planckSpectralRadiance(nm * 1e-9, 5200) * 1e-13).toPrecision(8)}`);
    await page.goto(`${baseUrl()}/projects/1/upload`);
    await page.getByRole('radio', { name: /Spectrum of one target/ }).check();
    await page.getByLabel('Target', { exact: true }).selectOption({ label: 'GW 106' });
    await page.getByLabel('Measurement file').setInputFiles({ name: 'gw106-spectrum.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await page.getByRole('button', { name: 'Upload and preview' }).click();
    await page.getByTestId('spectrum-chart').waitFor();
    // Without flux uncertainties the fit's χ² is in flux units squared, so the preview says how σ was found instead.
    expect(await page.getByTestId('spectrum-fit-quality').textContent()).toMatch(/No flux uncertainties given/);
    await page.getByRole('button', { name: /Commit the spectrum fit/ }).click();
    await page.getByTestId('commit-outcome').waitFor();
    await page.getByTestId('upload-targets').getByRole('link', { name: 'GW 106' }).click();
    await page.getByRole('heading', { name: 'GW 106' }).waitFor();
    await page.getByTestId('spectrum-chart').waitFor();
    expect(await page.getByTestId('spectrum-temperature').textContent()).toMatch(/^5200(\.\d+)? ± [\d.]+ K$/);
    expect(await page.getByTestId('spectrum-fit-quality').textContent()).toMatch(/No flux uncertainties given/);
    await screenshot(page, 'uploads-05-target-spectrum');
  });

  it('observer: a file with errors shows each at its cell and cannot be committed', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1/upload`);
    await page.getByLabel('Measurement file').setInputFiles({
      name: 'bad-night.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from('target,quantity,value,unit,band\nGW 107,magnitude,"7,12",mag,V\nGW 107,parallax,33.1,nm,\n'),
    });
    await page.getByRole('button', { name: 'Upload and preview' }).click();
    await page.getByTestId('preview-table').waitFor();
    const bad = page.locator('[data-row="2"] [data-error="true"]');
    expect(await bad.textContent()).toMatch(/decimal comma/);
    expect(await page.locator('[data-row="3"] [data-error="true"]').textContent()).toMatch(/not allowed for parallax/);
    expect(await page.getByRole('button', { name: /Commit all/ }).isDisabled()).toBe(true);
    expect(await page.getByTestId('commit-blocked').textContent()).toMatch(/2 errors/);
    await screenshot(page, 'uploads-06-errors');
  });

  it('reader: sees the upload history but no upload link, the upload page is refused, and the sheet shows approved values only', async () => {
    const page = await pageAs('reader@demo.invalid');
    await openProject(page);
    const projectNav = page.getByRole('navigation', { name: 'Project' });
    await projectNav.getByRole('link', { name: 'Uploads', exact: true }).waitFor();
    expect(await projectNav.getByRole('link', { name: 'Upload', exact: true }).count()).toBe(0);
    await projectNav.getByRole('link', { name: 'Uploads', exact: true }).click();
    await page.getByTestId('uploads-table').waitFor();
    expect(await page.getByRole('link', { name: 'Upload a file' }).count()).toBe(0);
    await screenshot(page, 'uploads-07-reader-history');
    await page.goto(`${baseUrl()}/projects/1/upload`);
    await page.getByRole('heading', { name: 'Your role does not allow this' }).waitFor();
    await screenshot(page, 'uploads-08-reader-refused');

    // The server sends a reader approved values only: GW 101 was signed off in the demo, GW 120 not yet.
    await page.goto(`${baseUrl()}/projects/1`);
    await page.getByRole('link', { name: 'GW 101', exact: true }).click();
    await page.getByTestId('derived-line').first().waitFor();
    const statuses = await page.getByTestId('derived-status').allTextContents();
    expect(statuses.length).toBeGreaterThan(5);
    expect(statuses.every((s) => /approved/i.test(s))).toBe(true);
    await page.goto(`${baseUrl()}/projects/1`);
    await page.getByRole('link', { name: 'GW 120', exact: true }).click();
    await page.getByTestId('derived-withheld').waitFor();
    expect(await page.getByTestId('derived-status').count()).toBe(0);
    await page.getByTestId('measurements-table').waitFor();
    await screenshot(page, 'uploads-09-reader-target-sheet');
  });
});

/**
 * A season's file large enough that its commit takes seconds: `rows` rows
 * over `targets` new targets, each target given a parallax and a B−V besides
 * its V magnitudes, so that every target's whole chain is derived (the
 * commit's longer half); one row a night in October, at most 31 a target. With V alone the commit took under a second and
 * could end between two looks at its progress.
 */
function season(rows: number, targets: number, tag: string): Buffer {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,band,observed_at'];
  for (let i = 0; i < rows; i += 1) {
    const t = i % targets;
    const night = Math.floor(i / targets);
    const position = i < targets ? `${((t * 0.03) % 360).toFixed(3)},${(-60 + (t % 1200) * 0.1).toFixed(2)}` : ',';
    const [quantity, value, uncertainty, unit, band] =
      night === 1
        ? ['parallax', (20 + (t % 80)).toFixed(2), '0.05', 'mas', '']
        : night === 2
          ? ['colour_index', (0.4 + (t % 80) / 100).toFixed(2), '0.01', 'mag', 'B-V']
          : ['magnitude', (6 + (i % 40) / 10).toFixed(2), '0.02', 'mag', 'V'];
    lines.push(`${tag} ${t + 1},${position},${quantity},${value},${uncertainty},${unit},${band},2026-10-${String(1 + night).padStart(2, '0')}T21:00:00Z`);
  }
  return Buffer.from(`${lines.join('\n')}\n`);
}

describe.skipIf(!chromiumAvailable)('a large commit in the browser', () => {
  const { baseUrl, pageAs } = browserSuite();
  // 30 000 rows over 1 000 new targets, each derived whole, keep the commit running for seconds on either engine (about 3 s from the click on SQLite here, unloaded); a 100 000-row commit is timed by npm run bench:commit-latency.
  const rows = 30_000;
  const targets = 1_000;
  const n = (x: number) => x.toLocaleString('en-US');

  for (const [theme, width] of [['day', 1366], ['night', 390]] as const) {
    it(`shows rows written and targets derived while it runs (${theme}, ${width} px), and axe finds nothing`, { timeout: 180_000 }, async () => {
      const page = await pageAs('observer@demo.invalid');
      await page.setViewportSize({ width, height: 900 });
      await page.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
      await page.goto(`${baseUrl()}/projects/1/upload`);
      await page.getByLabel('Measurement file').setInputFiles({ name: `season-${theme}.csv`, mimeType: 'text/csv', buffer: season(rows, targets, theme === 'day' ? 'PD' : 'PN') });
      await page.getByRole('button', { name: 'Upload and preview' }).click();
      await page.waitForURL(/\/projects\/\d+\/uploads\/\d+$/, { timeout: 60_000 });
      // The preview of so many rows is made in the upload worker: up to a minute and a half on a loaded machine.
      await page.getByRole('button', { name: `Commit all ${n(rows)} measurements` }).click({ timeout: 90_000 });
      const status = page.getByTestId('commit-progress').getByRole('status');
      await status.filter({ hasText: /Writing measurements|Deriving values/ }).waitFor({ timeout: 60_000 });
      expect(await status.textContent()).toMatch(new RegExp(`^(Writing measurements: [\\d,]+ of ${n(rows)}|Deriving values: [\\d,]+ of ${n(targets)} targets \\(${n(rows)} measurements written\\))$`));
      // The page lists the new targets; the shot is the screenful around the commit panel.
      await page.getByTestId('commit-progress').scrollIntoViewIfNeeded();
      await page.screenshot({ path: path.join(shotsDir, `uploads-commit-progress-${theme}-${width}.png`) });
      expect(await axeViolations(page)).toEqual([]);
      await page.getByTestId('commit-outcome').waitFor({ timeout: 120_000 });
      expect(await page.getByTestId('commit-outcome').textContent()).toContain(`${n(rows)} measurements added`);
    });
  }
});
