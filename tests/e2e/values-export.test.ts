import fs from 'node:fs';
import Papa from 'papaparse';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/**
 * The project page's Export values links, as a person clicks them: the
 * browser saves the file, and a general XML parser (fast-xml-parser) or
 * papaparse reads it back. The demo project holds approved and proposed values.
 */
describe.skipIf(!chromiumAvailable)('exporting the values from the project page', () => {
  const { pageAs } = browserSuite();

  async function save(page: Page, link: RegExp): Promise<{ name: string; text: string }> {
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: link }).click()]);
    const file = await download.path();
    return { name: download.suggestedFilename(), text: fs.readFileSync(file, 'utf8') };
  }

  async function openProject(page: Page) {
    await page.getByRole('link', { name: /Glasswing Nearby Dwarfs Programme/ }).first().click();
    await page.getByRole('heading', { name: 'Export values' }).waitFor();
  }

  it('lead: a VOTable with proposals included opens in an XML parser, with units and UCDs', async () => {
    const page = await pageAs('lead@demo.invalid');
    await openProject(page);
    await page.getByLabel(/Include proposed/).check();
    await screenshot(page, 'values-export-lead');
    const { name, text } = await save(page, /Download VOTable/);
    expect(name).toBe('GLASSWING-values.vot.xml');
    expect(XMLValidator.validate(text)).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '@_', parseTagValue: false, isArray: (n) => ['FIELD', 'TR', 'TD', 'INFO'].includes(n) }).parse(text);
    expect(doc.VOTABLE['@_version']).toBe('1.4');
    const fields = doc.VOTABLE.RESOURCE.TABLE.FIELD as { '@_name': string; '@_unit'?: string; '@_ucd': string }[];
    const temperature = fields.find((f) => f['@_name'] === 'temperature')!;
    expect([temperature['@_unit'], temperature['@_ucd']]).toEqual(['K', 'phys.temperature.effective']);
    const rows = doc.VOTABLE.RESOURCE.TABLE.DATA.TABLEDATA.TR as { TD: string[] }[];
    expect(rows.length).toBeGreaterThan(0);
    const statuses = new Set(rows.flatMap((r) => r.TD.filter((c) => c === 'approved' || c === 'proposed')));
    expect([...statuses].sort()).toEqual(['approved', 'proposed']);
  });

  it('reader: one CSV of approved values only, with no choice offered', async () => {
    const page = await pageAs('reader@demo.invalid');
    await openProject(page);
    expect(await page.getByLabel(/Include proposed/).count()).toBe(0);
    const { name, text } = await save(page, /Download CSV/);
    expect(name).toBe('GLASSWING-values.csv');
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.length).toBeGreaterThan(0);
    const statusCells = parsed.data.flatMap((r) => Object.entries(r).filter(([k, v]) => k.endsWith('_status') && v !== '').map(([, v]) => v));
    expect(statusCells.length).toBeGreaterThan(0);
    expect(new Set(statusCells)).toEqual(new Set(['approved']));
  });
});
