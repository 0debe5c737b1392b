import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

// Evaluated through the DevTools protocol: the app's CSP (script-src 'self') rightly refuses an injected <script>.
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

interface AxeViolation {
  id: string;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

/** What axe-core (WCAG 2.0, 2.1 and 2.2 A and AA rules) finds on the page as it is now, one line per rule broken. */
export async function axeViolations(page: Page): Promise<string[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags } });
    return result.violations;
  }, WCAG_TAGS);
  const describeNode = (n: AxeViolation['nodes'][number]) => `${n.target.join(' ')} (${(n.failureSummary ?? '').split('\n').slice(1, 2).join('').trim()})`;
  return violations.map((v) => `${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map(describeNode).join(' | ')}`);
}
