import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeViolations } from './axe';
import { browserSuite, chromiumAvailable, screenshot } from './harness';
import { apiWrite, linkFromMail, type CaughtLink } from './mail';

/**
 * The accessibility walk: each page checked by axe-core (the Deque engine,
 * WCAG 2.0, 2.1 and 2.2 A and AA rules) in both themes, at a phone's width
 * (390 px) and a laptop's (1366 px), as the role that uses each page. The
 * pages come in groups, one test file each (tests/e2e/accessibility-*.test.ts),
 * so the browser workers share the walk.
 */

/** What a page's address rests on, each made the first time a page asks for it in a walk. */
export interface WalkFixtures {
  target(): Promise<number>;
  /** A preview whose rows fail. */
  upload(): Promise<number>;
  /** A mailed invitation as the mail fake caught it: its link's path and fragment, and the message's id. */
  invitation(): Promise<CaughtLink>;
  /** Path and fragment of a mailed reset link. */
  reset(): Promise<string>;
}

/** A page to check; `who` null is a visitor who has not signed in. `fitsPhone` pages must not scroll sideways at 390 px. */
export interface PageSpec {
  name: string;
  who: string | null;
  path: (fixtures: WalkFixtures) => string | Promise<string>;
  ready: (page: Page) => Promise<unknown>;
  fitsPhone?: boolean;
}

const LEAD = 'lead@demo.invalid';
const ADMIN = 'admin@demo.invalid';
const WALK_TIMEOUT_MS = 240_000;

/** Signed out, and each person's own account pages. */
export const publicAndAccountPages: PageSpec[] = [
  { name: 'sign-in', who: null, path: () => '/sign-in', ready: (p) => p.getByRole('heading', { name: 'Sign in' }).waitFor() },
  { name: 'forgot-password', who: null, path: () => '/forgot-password', ready: (p) => p.getByRole('heading', { name: 'Forgot your password?' }).waitFor(), fitsPhone: true },
  { name: 'reset-password', who: null, path: (f) => f.reset(), ready: (p) => p.getByLabel('New password', { exact: true }).waitFor(), fitsPhone: true },
  { name: 'invitation', who: null, path: async (f) => (await f.invitation()).path, ready: (p) => p.getByRole('button', { name: 'Create my account and join' }).waitFor(), fitsPhone: true },
  {
    name: 'invitation-refused',
    who: null,
    path: () => `/invitation#${'Q'.repeat(43)}`,
    ready: (p) => p.getByText('Error: This link is not known.', { exact: true }).waitFor(),
    fitsPhone: true,
  },
  { name: 'mail-preferences', who: 'observer@demo.invalid', path: () => '/account/mail', ready: (p) => p.getByLabel('The weekly summary of this project').first().waitFor(), fitsPhone: true },
  { name: 'account-password', who: 'reader@demo.invalid', path: () => '/account/password', ready: (p) => p.getByLabel('Current password').waitFor(), fitsPhone: true },
  { name: 'account-sessions', who: 'reader@demo.invalid', path: () => '/account/sessions', ready: (p) => p.getByText('This browser').waitFor(), fitsPhone: true },
  { name: 'caught-mail', who: ADMIN, path: async (f) => `/admin/mail?message=${(await f.invitation()).id}`, ready: (p) => p.getByTestId('mail-text').waitFor() },
];

/** A project's own pages, from the lead's seat. */
export const projectPages: PageSpec[] = [
  // With an invitation waiting, so its table is on the page.
  {
    name: 'members',
    who: LEAD,
    path: async (f) => {
      await f.invitation();
      return '/projects/1/members';
    },
    ready: (p) => p.getByRole('table', { name: 'Invitations waiting for an answer' }).waitFor(),
  },
  { name: 'home', who: LEAD, path: () => '/', ready: (p) => p.getByRole('heading', { name: /recent activity/i }).waitFor() },
  { name: 'project', who: LEAD, path: () => '/projects/1', ready: (p) => p.getByRole('link', { name: 'GW 101', exact: true }).waitFor(), fitsPhone: true },
  { name: 'review-queue', who: LEAD, path: () => '/projects/1/review', ready: (p) => p.getByRole('heading', { name: 'GW 115' }).first().waitFor() },
  { name: 'trail', who: LEAD, path: () => '/projects/1/trail', ready: (p) => p.getByTestId('trail-entry').first().waitFor() },
  { name: 'target-sheet', who: LEAD, path: async (f) => `/projects/1/targets/${await f.target()}`, ready: (p) => p.getByTestId('derived-line').first().waitFor(), fitsPhone: true },
  { name: 'upload-preview-errors', who: LEAD, path: async (f) => `/projects/1/uploads/${await f.upload()}`, ready: (p) => p.getByTestId('commit-blocked').waitFor() },
  {
    name: 'hr-diagram',
    who: LEAD,
    path: () => '/projects/1/hr',
    ready: (p) => p.waitForFunction(() => performance.getEntriesByName('hr:first-draw').length > 0),
    fitsPhone: true,
  },
];

/** The tools and the pages read by the other roles. */
export const toolPages: PageSpec[] = [
  { name: 'calculator', who: LEAD, path: () => '/calculator', ready: fillCalculator },
  { name: 'api-reference', who: 'observer@demo.invalid', path: () => '/api-reference', ready: (p) => p.getByRole('heading', { name: 'Uploads', exact: true, level: 2 }).waitFor() },
  { name: 'settings', who: LEAD, path: () => '/projects/1/settings', ready: (p) => p.getByLabel(/site name/i).waitFor() },
  { name: 'summary', who: 'pi@demo.invalid', path: () => '/projects/1/summary', ready: (p) => p.frameLocator('[data-testid="mail-html"]').getByRole('heading', { name: 'Values approved' }).waitFor() },
  {
    name: 'reader-target-sheet',
    who: 'reader@demo.invalid',
    path: async (f) => `/projects/1/targets/${await f.target()}`,
    ready: (p) => p.getByTestId('derived-line').first().waitFor(),
    fitsPhone: true,
  },
];

/** A Sun-like star typed into the calculator, so its derived lines (methods with their subscripts, warnings) are on the page. */
async function fillCalculator(page: Page): Promise<void> {
  const typed: [string, string, string][] = [
    ['Continuum peak wavelength', '500', '5'],
    ['Colour excess E(B−V)', '0.02', '0.01'],
    ['V magnitude', '4.8', '0.02'],
    ['Parallax', '100', '0.5'],
  ];
  for (const [label, value, sigma] of typed) {
    await page.getByLabel(label, { exact: true }).fill(value);
    await page.getByLabel(`Uncertainty (1σ) of ${label}`, { exact: true }).fill(sigma);
  }
  await page.getByRole('region', { name: 'Derived values' }).locator('[data-quantity="bolometric_flux"] sub').first().waitFor();
}

/** A file whose rows fail (a decimal comma, a parallax in nm, a new target without a value) through the upload page; its preview's id. */
async function uploadWithErrors(page: Page, baseUrl: string): Promise<number> {
  await page.goto(`${baseUrl}/projects/1/upload`);
  await page.getByLabel('Measurement file').setInputFiles({
    name: 'night-with-errors.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from('target,quantity,value,unit,band\nGW 107,magnitude,"7,12",mag,V\nGW 107,parallax,33.1,nm,\nGW 990,magnitude,,mag,V\n'),
  });
  await page.getByRole('button', { name: 'Upload and preview' }).click();
  await page.waitForURL(/\/projects\/1\/uploads\/\d+$/);
  return Number(new URL(page.url()).pathname.split('/').pop());
}

/** The first call runs `make`; later calls share its answer. */
function once<T>(make: () => Promise<T>): () => Promise<T> {
  let made: Promise<T> | undefined;
  return () => (made ??= make());
}

/** One file's walk: its pages in the day theme and in the night theme, each at 390 and 1366 px, on its own app and browser. */
export function describeAccessibilityWalk(group: string, pages: PageSpec[]): void {
  describe.skipIf(!chromiumAvailable)(`accessibility of the ${group} (axe-core)`, () => {
    const { pageAs, newPage, baseUrl } = browserSuite();

    for (const theme of ['day', 'night'] as const) {
      it(`finds nothing on any page in the ${theme} theme at 390 and 1366 px`, async () => {
        const found: string[] = [];
        const byWho = new Map<string | null, Page>();
        const pageFor = async (who: string | null): Promise<Page> => {
          let page = byWho.get(who);
          if (!page) {
            page = who ? await pageAs(who) : await newPage();
            if (!who) {
              // Once the app has started: its theme effect stores the theme it began with.
              await page.goto(`${baseUrl()}/sign-in`);
              await page.getByRole('heading', { name: 'Sign in' }).waitFor();
            }
            await page.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
            byWho.set(who, page);
          }
          return page;
        };
        // Made on the lead's and the site admin's pages before the walk opens them, so the walk's own navigation is not interrupted.
        const fixtures: WalkFixtures = {
          target: once(async () => {
            const lead = await pageFor(LEAD);
            const targets = await lead.evaluate(async () => (await (await fetch('/api/projects/1/targets?q=GW101')).json()) as { items: { id: number }[] });
            return targets.items[0].id;
          }),
          upload: once(async () => uploadWithErrors(await pageFor(LEAD), baseUrl())),
          invitation: once(async () => {
            // A waiting invitation, read from what the mail fake received.
            const invitee = `a11y-${theme}@demo.invalid`;
            expect((await apiWrite(await pageFor(LEAD), 'POST', '/projects/1/invitations', { email: invitee, role: 'reader' })).status).toBe(201);
            return linkFromMail(await pageFor(ADMIN), invitee, 'invitation');
          }),
          reset: once(async () => {
            await (await pageFor(null)).evaluate(() =>
              fetch('/api/auth/password-reset', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: 'pi@demo.invalid' }) }),
            );
            return (await linkFromMail(await pageFor(ADMIN), 'pi@demo.invalid', 'reset-password')).path;
          }),
        };
        for (const spec of pages) {
          const path = await spec.path(fixtures);
          const page = await pageFor(spec.who);
          for (const width of [390, 1366]) {
            await page.setViewportSize({ width, height: 900 });
            await page.goto(`${baseUrl()}${path}`);
            await spec.ready(page);
            expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
            await screenshot(page, `a11y-${spec.name}-${theme}-${width}`);
            for (const v of await axeViolations(page)) found.push(`${spec.name} ${width}px: ${v}`);
            if (spec.fitsPhone && width === 390) {
              const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
              if (scrollWidth > 390) found.push(`${spec.name} 390px: scrolls sideways, ${scrollWidth} px wide`);
            }
          }
        }
        expect(found).toEqual([]);
      }, WALK_TIMEOUT_MS);
    }
  });
}
