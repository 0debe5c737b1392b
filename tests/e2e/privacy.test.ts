import fs from 'node:fs';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/** Each theme at a phone's and a laptop's width: the page's name is visible, axe finds nothing, nothing scrolls sideways at 390 px. */
async function inEveryLook(page: Page, shot: string, ready: () => Promise<void>) {
  for (const theme of ['day', 'night'] as const) {
    await page.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
    for (const width of [390, 1366]) {
      await page.setViewportSize({ width, height: 900 });
      await page.reload();
      await ready();
      expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
      expect(await axeViolations(page), `${shot} ${theme} ${width}`).toEqual([]);
      if (width === 390) expect(await page.evaluate(() => document.documentElement.scrollWidth), `${shot} ${theme}`).toBeLessThanOrEqual(390);
      await screenshot(page, `${shot}-${theme}-${width}`);
    }
  }
}

/** The privacy notice (ASVS 4.0.3 8.3.3) and the download of one's own data (8.3.2), in Chromium against the production build. */
describe.skipIf(!chromiumAvailable)('privacy notice and your data', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('the notice is reached from the sign-in page without signing in, says what is recorded, why, how long, who sees it and who is responsible, by day and night at 390 and 1366 px', async () => {
    const page = await newPage();
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByRole('link', { name: 'Privacy notice' }).click();
    await page.waitForURL((url) => url.pathname === '/privacy');
    const heading = page.getByRole('heading', { name: 'Privacy notice', level: 1 });
    await heading.waitFor();
    for (const part of ['Who is responsible', 'What is recorded, why, and for how long', 'Who can see it', 'What you can do']) {
      await page.getByRole('heading', { name: part, level: 2 }).waitFor();
    }
    const text = (await page.locator('main').innerText()).toLowerCase();
    for (const said of ['password', 'second factor', 'browser', 'network address', 'review trail', 'security log', 'mail preferences', '12 hours', '30 minutes', '7 days', '48 hours', 'with the project', 'site admins', 'responsible', 'not yet adapted']) {
      expect(text, said).toContain(said);
    }
    await inEveryLook(page, 'privacy', () => heading.waitFor());
  });

  it('signed in, the footer reaches the notice; Your data downloads starledger-account-<date>.json with the account and no credential, by day and night at 390 and 1366 px', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.getByRole('contentinfo').getByRole('link', { name: 'Privacy notice' }).click();
    await page.getByRole('heading', { name: 'Privacy notice', level: 1 }).waitFor();
    await page.goBack();

    await page.getByRole('link', { name: 'Your data', exact: true }).click();
    const heading = page.getByRole('heading', { name: 'Your data', level: 1 });
    await heading.waitFor();
    await inEveryLook(page, 'account-data', () => heading.waitFor());

    const download = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Download your data' }).click();
    const file = await download;
    expect(file.suggestedFilename()).toMatch(/^starledger-account-\d{4}-\d{2}-\d{2}\.json$/);
    const saved = JSON.parse(fs.readFileSync((await file.path())!, 'utf8'));
    expect(saved.account.email).toBe('observer@demo.invalid');
    expect(saved.memberships.length).toBeGreaterThan(0);
    expect(saved.sessions.some((s: { current: boolean }) => s.current)).toBe(true);
    expect(JSON.stringify(saved)).not.toMatch(/scrypt|"(passwordHash|tokenHash|secret|sid)"/);
  });
});
