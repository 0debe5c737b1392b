import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/**
 * The review loop's pages checked by axe-core (the Deque engine, WCAG 2.0,
 * 2.1 and 2.2 A and AA rules) in both themes, at a phone's width (390 px)
 * and a laptop's (1366 px), as the role that uses each page.
 */
// Evaluated through the DevTools protocol: the app's CSP (script-src 'self') rightly refuses an injected <script>.
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

interface AxeViolation {
  id: string;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

async function axeViolations(page: Page): Promise<string[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags } });
    return result.violations;
  }, WCAG_TAGS);
  const describeNode = (n: AxeViolation['nodes'][number]) => `${n.target.join(' ')} (${(n.failureSummary ?? '').split('\n').slice(1, 2).join('').trim()})`;
  return violations.map((v) => `${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map(describeNode).join(' | ')}`);
}

const pages: { name: string; who: string; path: (ids: { target: number }) => string; ready: (page: Page) => Promise<unknown> }[] = [
  { name: 'home', who: 'lead@demo.invalid', path: () => '/', ready: (p) => p.getByRole('heading', { name: /recent activity/i }).waitFor() },
  { name: 'project', who: 'lead@demo.invalid', path: () => '/projects/1', ready: (p) => p.getByRole('link', { name: 'GW 101', exact: true }).waitFor() },
  { name: 'review-queue', who: 'lead@demo.invalid', path: () => '/projects/1/review', ready: (p) => p.getByRole('heading', { name: 'GW 115' }).first().waitFor() },
  { name: 'trail', who: 'lead@demo.invalid', path: () => '/projects/1/trail', ready: (p) => p.getByTestId('trail-entry').first().waitFor() },
  { name: 'hr-diagram', who: 'lead@demo.invalid', path: () => '/projects/1/hr', ready: (p) => p.waitForFunction(() => performance.getEntriesByName('hr:first-draw').length > 0) },
  { name: 'target-sheet', who: 'lead@demo.invalid', path: ({ target }) => `/projects/1/targets/${target}`, ready: (p) => p.getByTestId('derived-line').first().waitFor() },
  { name: 'settings', who: 'lead@demo.invalid', path: () => '/projects/1/settings', ready: (p) => p.getByLabel(/site name/i).waitFor() },
  { name: 'reader-target-sheet', who: 'reader@demo.invalid', path: ({ target }) => `/projects/1/targets/${target}`, ready: (p) => p.getByTestId('derived-line').first().waitFor() },
];

describe.skipIf(!chromiumAvailable)('accessibility of the review pages (axe-core)', () => {
  const { pageAs, baseUrl } = browserSuite();

  for (const theme of ['day', 'night'] as const) {
    it(`finds nothing on any page in the ${theme} theme at 390 and 1366 px`, async () => {
      const found: string[] = [];
      const byWho = new Map<string, Page>();
      for (const spec of pages) {
        let page = byWho.get(spec.who);
        if (!page) {
          page = await pageAs(spec.who);
          await page.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
          byWho.set(spec.who, page);
        }
        const targets = await page.evaluate(async () => (await (await fetch('/api/projects/1/targets?q=GW101')).json()) as { items: { id: number }[] });
        for (const width of [390, 1366]) {
          await page.setViewportSize({ width, height: 900 });
          await page.goto(`${baseUrl()}${spec.path({ target: targets.items[0].id })}`);
          await spec.ready(page);
          expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
          await screenshot(page, `a11y-${spec.name}-${theme}-${width}`);
          for (const v of await axeViolations(page)) found.push(`${spec.name} ${width}px: ${v}`);
        }
      }
      expect(found).toEqual([]);
    });
  }
});
