import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';
import { apiWrite, linkFromMail } from './support/mail';

/**
 * The review loop's pages checked by axe-core (the Deque engine, WCAG 2.0,
 * 2.1 and 2.2 A and AA rules) in both themes, at a phone's width (390 px)
 * and a laptop's (1366 px), as the role that uses each page.
 */
interface Ids {
  target: number;
  upload: number;
  /** Path and fragment of a mailed invitation link and of a mailed reset link. */
  invitation: string;
  reset: string;
}

/** A page to check; `who` null is a visitor who has not signed in. `fitsPhone` pages must not scroll sideways at 390 px. */
interface PageSpec {
  name: string;
  who: string | null;
  path: (ids: Ids) => string;
  ready: (page: Page) => Promise<unknown>;
  fitsPhone?: boolean;
}

const WALK_TIMEOUT_MS = 240_000;
const pages: PageSpec[] = [
  { name: 'sign-in', who: null, path: () => '/sign-in', ready: (p) => p.getByRole('heading', { name: 'Sign in' }).waitFor() },
  { name: 'forgot-password', who: null, path: () => '/forgot-password', ready: (p) => p.getByRole('heading', { name: 'Forgot your password?' }).waitFor(), fitsPhone: true },
  { name: 'reset-password', who: null, path: ({ reset }) => reset, ready: (p) => p.getByLabel('New password', { exact: true }).waitFor(), fitsPhone: true },
  { name: 'invitation', who: null, path: ({ invitation }) => invitation, ready: (p) => p.getByRole('button', { name: 'Create my account and join' }).waitFor(), fitsPhone: true },
  {
    name: 'invitation-refused',
    who: null,
    path: () => `/invitation#${'Q'.repeat(43)}`,
    ready: (p) => p.getByText('Error: This link is not known.', { exact: true }).waitFor(),
    fitsPhone: true,
  },
  {
    name: 'members',
    who: 'lead@demo.invalid',
    path: () => '/projects/1/members',
    ready: (p) => p.getByRole('table', { name: 'Invitations waiting for an answer' }).waitFor(),
  },
  { name: 'home', who: 'lead@demo.invalid', path: () => '/', ready: (p) => p.getByRole('heading', { name: /recent activity/i }).waitFor() },
  {
    name: 'project',
    who: 'lead@demo.invalid',
    path: () => '/projects/1',
    ready: (p) => p.getByRole('link', { name: 'GW 101', exact: true }).waitFor(),
    fitsPhone: true,
  },
  { name: 'review-queue', who: 'lead@demo.invalid', path: () => '/projects/1/review', ready: (p) => p.getByRole('heading', { name: 'GW 115' }).first().waitFor() },
  { name: 'trail', who: 'lead@demo.invalid', path: () => '/projects/1/trail', ready: (p) => p.getByTestId('trail-entry').first().waitFor() },
  {
    name: 'target-sheet',
    who: 'lead@demo.invalid',
    path: ({ target }) => `/projects/1/targets/${target}`,
    ready: (p) => p.getByTestId('derived-line').first().waitFor(),
    fitsPhone: true,
  },
  {
    name: 'upload-preview-errors',
    who: 'lead@demo.invalid',
    path: ({ upload }) => `/projects/1/uploads/${upload}`,
    ready: (p) => p.getByTestId('commit-blocked').waitFor(),
  },
  {
    name: 'hr-diagram',
    who: 'lead@demo.invalid',
    path: () => '/projects/1/hr',
    ready: (p) => p.waitForFunction(() => performance.getEntriesByName('hr:first-draw').length > 0),
    fitsPhone: true,
  },
  { name: 'calculator', who: 'lead@demo.invalid', path: () => '/calculator', ready: fillCalculator },
  { name: 'api-reference', who: 'observer@demo.invalid', path: () => '/api-reference', ready: (p) => p.getByRole('heading', { name: 'Uploads', exact: true, level: 2 }).waitFor() },
  { name: 'settings', who: 'lead@demo.invalid', path: () => '/projects/1/settings', ready: (p) => p.getByLabel(/site name/i).waitFor() },
  { name: 'summary', who: 'pi@demo.invalid', path: () => '/projects/1/summary', ready: (p) => p.frameLocator('[data-testid="mail-html"]').getByRole('heading', { name: 'Values approved' }).waitFor() },
  { name: 'mail-preferences', who: 'observer@demo.invalid', path: () => '/account/mail', ready: (p) => p.getByLabel('The weekly summary of this project').first().waitFor(), fitsPhone: true },
  { name: 'account-password', who: 'reader@demo.invalid', path: () => '/account/password', ready: (p) => p.getByLabel('Current password').waitFor(), fitsPhone: true },
  { name: 'account-sessions', who: 'reader@demo.invalid', path: () => '/account/sessions', ready: (p) => p.getByText('This browser').waitFor(), fitsPhone: true },
  { name: 'caught-mail', who: 'admin@demo.invalid', path: () => '/admin/mail?message=1', ready: (p) => p.getByTestId('mail-text').waitFor() },
  {
    name: 'reader-target-sheet',
    who: 'reader@demo.invalid',
    path: ({ target }) => `/projects/1/targets/${target}`,
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

describe.skipIf(!chromiumAvailable)('accessibility of the review pages (axe-core)', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  for (const theme of ['day', 'night'] as const) {
    // Every page at two widths with axe on each: 77–93 s a theme while other test runs shared the machine, past the project's 60 s.
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
      const lead = await pageFor('lead@demo.invalid');
      const targets = await lead.evaluate(async () => (await (await fetch('/api/projects/1/targets?q=GW101')).json()) as { items: { id: number }[] });
      // A waiting invitation and a reset link, each read from what the mail fake received.
      const invitee = `a11y-${theme}@demo.invalid`;
      expect((await apiWrite(lead, 'POST', '/projects/1/invitations', { email: invitee, role: 'reader' })).status).toBe(201);
      const visitor = await pageFor(null);
      await visitor.evaluate(() => fetch('/api/auth/password-reset', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: 'pi@demo.invalid' }) }));
      const admin = await pageFor('admin@demo.invalid');
      const invitation = (await linkFromMail(admin, invitee, 'invitation')).path;
      const reset = (await linkFromMail(admin, 'pi@demo.invalid', 'reset-password')).path;
      const ids: Ids = { target: targets.items[0].id, upload: await uploadWithErrors(lead, baseUrl()), invitation, reset };
      for (const spec of pages) {
        const page = await pageFor(spec.who);
        for (const width of [390, 1366]) {
          await page.setViewportSize({ width, height: 900 });
          await page.goto(`${baseUrl()}${spec.path(ids)}`);
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

  it('night theme: every colour is red light only, and the Dim control dims the page and is remembered', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.evaluate(() => window.localStorage.setItem('starledger.theme', 'day'));
    await page.reload();
    await page.getByRole('button', { name: /night theme/i }).waitFor();
    expect(await page.getByRole('button', { name: /^Dim/ }).count()).toBe(0);
    await page.getByRole('button', { name: /night theme/i }).click();
    // Each token as the browser resolves it (the build may write #000000 as #000 or #ff0000 as red).
    const tokens = await page.evaluate(() => {
      const probe = document.body.appendChild(document.createElement('span'));
      const colours = ['paper', 'paper-deep', 'ink', 'ink-soft', 'rule', 'brass', 'brass-deep', 'alert', 'good'].map((t) => {
        probe.style.color = `var(--sl-${t})`;
        return [t, getComputedStyle(probe).color];
      });
      probe.remove();
      return colours;
    });
    for (const [token, colour] of tokens) expect(colour, token).toMatch(/^rgb\(\d+, 0, 0\)$/);
    const dim = page.getByRole('button', { name: /^Dim/ });
    expect(await dim.getAttribute('aria-pressed')).toBe('false');
    await dim.click();
    expect(await dim.getAttribute('aria-pressed')).toBe('true');
    expect(await page.evaluate(() => getComputedStyle(document.documentElement).filter)).toBe('brightness(0.6)');
    // The hint says the dimmed text no longer reaches 4.5:1: it is the observer's choice.
    expect(await dim.getAttribute('title')).toMatch(/below the 4\.5:1/);
    await page.reload();
    await page.getByRole('button', { name: /^Dim/ }).waitFor();
    expect(await page.evaluate(() => document.documentElement.dataset.dim)).toBe('on');
    await screenshot(page, 'a11y-night-dimmed');
    await page.getByRole('button', { name: /night theme/i }).click();
    expect(await page.evaluate(() => getComputedStyle(document.documentElement).filter)).toBe('none');
  });
});
