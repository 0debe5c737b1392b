import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/*
 * One night's file for a new target, small enough to know every value it
 * yields. Wien: T = b / λ = 2.897771955e-3 m K / 520e-9 m = 5572.6 K (CODATA
 * 2018 b), σ = T × 5/520 = 53.6 K, which the sheet rounds to one figure:
 * 5570 ± 50 K. Parallax: d = 1/p = 1 / 0.025″ = 40.0 pc, σ = d × 0.5/25 =
 * 0.8 pc: 40.0 ± 0.8 pc.
 */
const DESIGNATION = 'GW 140';
const NIGHT = [
  'target,ra,dec,quantity,value,uncertainty,unit,band,observed_at,instrument',
  `${DESIGNATION},04 12 33.0,+18 20 11,peak_wavelength,520,5,nm,,2026-11-28T22:40:00Z,spectrograph`,
  `${DESIGNATION},04 12 33.0,+18 20 11,parallax,25.0,0.5,mas,,2026-11-28T22:40:00Z,catalogue`,
].join('\n');

const TEMPERATURE = '5570 ± 50 K';
const DISTANCE = '40.0 ± 0.8 pc';
const REJECTION_NOTE = 'One peak wavelength is not enough for a spectral class we would publish; wait for the B−V colour.';

/**
 * The lead's sign-off in Chromium against the production build: an observer
 * uploads a night, the lead approves a selection and rejects one value with
 * a note, the trail records both, a reader then sees exactly the approved
 * values, and the PI sees no review controls.
 */
describe.skipIf(!chromiumAvailable)('the review loop in the browser', () => {
  const { baseUrl, pageAs } = browserSuite();
  let targetId = 0;

  /** The quantities the sheet shows, with the status word of each line. */
  async function sheetLines(page: Page): Promise<{ quantity: string | null; status: string | null; text: string | null }[]> {
    await page.getByTestId('derived-line').first().waitFor();
    return page.getByTestId('derived-line').evaluateAll((lines) =>
      lines.map((l) => ({
        quantity: l.getAttribute('data-quantity'),
        status: l.getAttribute('data-status'),
        text: l.textContent,
      })),
    );
  }

  it('observer: uploads a night for a new target, whose values wait for review', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1/upload`);
    await page.getByLabel('Measurement file').setInputFiles({ name: 'gw140-night.csv', mimeType: 'text/csv', buffer: Buffer.from(NIGHT) });
    await page.getByRole('button', { name: 'Upload and preview' }).click();
    await page.getByTestId('preview-table').waitFor();
    await page.getByRole('button', { name: 'Commit all 2 measurements' }).click();
    await page.getByTestId('commit-outcome').waitFor();
    await page.getByTestId('upload-targets').getByRole('link', { name: DESIGNATION }).click();
    await page.getByRole('heading', { name: DESIGNATION }).waitFor();
    targetId = Number(new URL(page.url()).pathname.split('/').pop());
    expect(targetId).toBeGreaterThan(0);

    const lines = await sheetLines(page);
    expect(lines.length).toBeGreaterThanOrEqual(3);
    expect(lines.every((l) => l.status === 'proposed')).toBe(true);
    // An observer follows the queue but does not decide.
    await page.getByTestId('awaiting-review').getByRole('link', { name: 'Open them in the review queue' }).click();
    await page.getByRole('heading', { name: 'Review queue' }).waitFor();
    await page.getByTestId('read-only-line').waitFor();
    await page.getByTestId('queue-item').first().waitFor();
    expect(await page.getByTestId('queue-item').count()).toBe(lines.length);
    expect(await page.getByRole('checkbox').count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Approve|^Reject/ }).count()).toBe(0);
    await screenshot(page, 'review-01-observer-queue');
  });

  it('lead: approves a selection (confirming the value it rests on) and rejects one with a note', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1`);
    await page.getByRole('navigation', { name: 'Project' }).getByRole('link', { name: 'Review', exact: true }).click();
    await page.getByRole('heading', { name: 'Review queue' }).waitFor();
    await page.getByTestId('queue-item').first().waitFor();
    await page.getByLabel('Target', { exact: true }).selectOption({ label: DESIGNATION });
    await page.waitForURL((url) => url.searchParams.get('target') === String(targetId));
    const group = page.getByRole('region', { name: DESIGNATION });
    await group.getByTestId('queue-item').first().waitFor();
    expect(await page.getByTestId('queue-group').count()).toBe(1);

    const adopted = group.locator('[data-testid="queue-item"][data-quantity="temperature"]');
    expect(await adopted.getByTestId('queue-proposed').textContent()).toContain(TEMPERATURE);
    expect(await adopted.getByTestId('queue-approved').textContent()).toContain('None approved yet.');
    const distance = group.locator('[data-testid="queue-item"][data-quantity="distance_parallax"]');
    expect(await distance.getByTestId('queue-proposed').textContent()).toContain(DISTANCE);
    expect(await distance.getByRole('link', { name: 'gw140-night.csv' }).count()).toBe(1);

    // A rejection without a note is refused at the note, and nothing is sent.
    await page.getByRole('checkbox', { name: `Spectral class of ${DESIGNATION}, revision 1` }).check();
    await page.getByRole('button', { name: 'Reject', exact: true }).click();
    const note = page.getByLabel('Note');
    await page.getByText('Say why the values are rejected.').waitFor();
    expect(await note.getAttribute('aria-invalid')).toBe('true');
    expect(await note.evaluate((el) => el === document.activeElement)).toBe(true);
    await screenshot(page, 'review-02-rejection-needs-note');

    // Reject it with the note, from the keyboard.
    await note.fill(REJECTION_NOTE);
    await page.getByRole('button', { name: 'Reject', exact: true }).focus();
    await page.keyboard.press('Enter');
    const status = page.getByTestId('review-status');
    await status.getByText(/^Done: Rejected 1 value: GW 140 spectral class r1\./).waitFor();
    // Focus moved on to the value now standing where the rejected one stood (or to the status line when none is left).
    expect(await page.evaluate(() => document.activeElement?.getAttribute('type') ?? document.activeElement?.getAttribute('role'))).toMatch(
      /checkbox|status/,
    );
    expect(await group.locator('[data-quantity="spectral_class"]').count()).toBe(0);
    await screenshot(page, 'review-03-rejected');

    // Approve the adopted temperature and the distance; the temperature rests on the Wien estimate, which is not selected.
    await page.getByRole('checkbox', { name: `Effective temperature, adopted of ${DESIGNATION}, revision 1` }).check();
    await page.getByRole('checkbox', { name: `Distance (parallax) of ${DESIGNATION}, revision 1` }).check();
    await page.getByTestId('selection-count').getByText('2 values selected.').waitFor();
    await note.fill('Checked against the night log.');
    await page.getByRole('button', { name: 'Approve 2 values' }).click();
    await page.getByRole('heading', { name: 'Approving these also approves:' }).waitFor();
    expect(await page.getByTestId('upstream-list').textContent()).toContain('effective temperature (Wien) r1');
    await screenshot(page, 'review-04-confirm-upstream');
    await page.getByRole('button', { name: 'Approve all 3' }).click();
    await status.getByText(/^Done: Approved 3 values:/).waitFor();
    const announced = await status.textContent();
    for (const q of ['effective temperature (Wien) r1', 'effective temperature, adopted r1', 'distance (parallax) r1']) expect(announced).toContain(q);
    await screenshot(page, 'review-05-approved');

    // The sheet shows the approved values, and the rejection in the spectral class's history with its note.
    await page.goto(`${baseUrl()}/projects/1/targets/${targetId}`);
    const lines = await sheetLines(page);
    const approved = lines.filter((l) => l.status === 'approved').map((l) => l.quantity);
    expect(approved.sort()).toEqual(['distance_parallax', 'temperature', 'temperature_wien']);
    const spectral = page.getByTestId('derived-quantity').filter({ has: page.locator('[data-quantity="spectral_class"]') });
    await spectral.getByText('Review history').click();
    const history = spectral.getByRole('table', { name: 'Review history of Spectral class' });
    await history.getByRole('cell', { name: 'Rejected' }).waitFor();
    await history.getByRole('cell', { name: REJECTION_NOTE }).waitFor();
    await screenshot(page, 'review-06-lead-sheet');
  });

  it('lead: the trail shows both decisions, with the note', async () => {
    const page = await pageAs('lead@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1/trail?target=${targetId}`);
    const trail = page.getByRole('table', { name: 'Review trail, newest first' });
    await trail.getByTestId('trail-entry').first().waitFor();
    const approvals = trail.getByTestId('trail-entry').filter({ hasText: 'Value approved' });
    const rejections = trail.getByTestId('trail-entry').filter({ hasText: 'Value rejected' });
    expect(await approvals.count()).toBe(3);
    expect(await rejections.count()).toBe(1);
    expect(await rejections.first().textContent()).toContain(REJECTION_NOTE);
    expect(await rejections.first().textContent()).toContain('Spectral class');
    expect(await approvals.filter({ hasText: 'Checked against the night log.' }).count()).toBe(3);
    await screenshot(page, 'review-07-trail');
  });

  it('reader: sees exactly the approved values on the sheet and in the project table', async () => {
    const page = await pageAs('reader@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1/targets/${targetId}`);
    await page.getByRole('heading', { name: DESIGNATION }).waitFor();
    const lines = await sheetLines(page);
    expect(lines.map((l) => l.quantity).sort()).toEqual(['distance_parallax', 'temperature', 'temperature_wien']);
    expect(lines.every((l) => l.status === 'approved')).toBe(true);
    expect(lines.find((l) => l.quantity === 'temperature')?.text).toContain(TEMPERATURE);
    expect(lines.find((l) => l.quantity === 'distance_parallax')?.text).toContain(DISTANCE);
    expect(await page.getByRole('button', { name: 'Re-run derivations' }).count()).toBe(0);
    expect(await page.getByTestId('awaiting-review').count()).toBe(0);
    await screenshot(page, 'review-08-reader-sheet');

    await page.goto(`${baseUrl()}/projects/1`);
    await page.getByLabel('Search').fill(DESIGNATION);
    const row = page.getByRole('table', { name: 'Targets' }).getByRole('row').filter({ has: page.getByRole('link', { name: DESIGNATION, exact: true }) });
    await row.getByText(TEMPERATURE).waitFor();
    const rowText = await row.textContent();
    expect(rowText).toContain(DISTANCE);
    expect(rowText).not.toMatch(/proposed/i);
    // The spectral class was rejected, so a reader has none to see.
    const header = await page.getByRole('table', { name: 'Targets' }).getByRole('columnheader').allTextContents();
    const spectralColumn = header.findIndex((h) => /Spectral class/.test(h));
    expect(spectralColumn).toBeGreaterThan(0);
    const spectralCell = (await row.getByRole('cell').nth(spectralColumn).textContent()) ?? '';
    expect(spectralCell).toContain('—');
    expect(spectralCell).not.toMatch(/[OBAFGKM]\d/);
    await screenshot(page, 'review-09-reader-table');

    await page.goto(`${baseUrl()}/projects/1/review`);
    await page.getByRole('heading', { name: 'Your role does not allow this' }).waitFor();
  });

  it('PI: no review link, the queue is refused, and the sheet has no review controls', async () => {
    const page = await pageAs('pi@demo.invalid');
    await page.goto(`${baseUrl()}/projects/1/targets/${targetId}`);
    await page.getByRole('heading', { name: DESIGNATION }).waitFor();
    await sheetLines(page);
    const projectNav = page.getByRole('navigation', { name: 'Project' });
    await projectNav.getByRole('link', { name: 'Targets' }).waitFor();
    expect(await projectNav.getByRole('link', { name: 'Review', exact: true }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Re-run derivations' }).count()).toBe(0);
    expect(await page.getByTestId('awaiting-review').count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Approve|^Reject/ }).count()).toBe(0);
    await screenshot(page, 'review-10-pi-sheet');

    await page.goto(`${baseUrl()}/projects/1/review`);
    await page.getByRole('heading', { name: 'Your role does not allow this' }).waitFor();
    expect(await page.getByRole('checkbox').count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Approve|^Reject|Re-run/ }).count()).toBe(0);
    await screenshot(page, 'review-11-pi-queue-refused');
  });
});
