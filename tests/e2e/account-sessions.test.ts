import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { createDb, type Db } from '../../server/db/knex';
import { demoAccounts } from '../../seeds/01-demo-scenario';
import { newTestDatabase, type TestDatabase } from '../support/test-database';
import { axeViolations } from './support/axe';
import { chromiumAvailable, launchBrowser, screenshot, signInAs, startApp, type RunningApp } from './support/harness';
import path from 'node:path';
import fs from 'node:fs';
import os from 'node:os';

/**
 * One's own sessions, and the end of a session under an open page, in
 * Chromium against the production build. The test reaches into the app's
 * database only to make a session look 31 minutes unused (time passing
 * without waiting for it).
 */
describe.skipIf(!chromiumAvailable)('my sessions in the browser, and a session ending under me', () => {
  let app: RunningApp;
  let browser: Browser;
  let database: TestDatabase;
  let db: Db;
  let folder: string;

  beforeAll(async () => {
    folder = fs.mkdtempSync(path.join(os.tmpdir(), 'sessions-e2e-'));
    database = await newTestDatabase(`file:${path.join(folder, 'app.sqlite')}`);
    app = await startApp({ databaseUrl: database.url });
    db = createDb(database.url);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await db?.destroy();
    await app?.stop();
    await database?.drop();
    fs.rmSync(folder, { recursive: true, force: true });
  });

  async function pageAs(email: string, width = 1366): Promise<Page> {
    const page = await (await browser.newContext({ viewport: { width, height: 900 } })).newPage();
    await signInAs(page, app.baseUrl, email, demoAccounts.find((a) => a.email === email)!.password);
    return page;
  }

  it('lists this browser and the others, looks right by day and night at 390 and 1366 px, and ends another, which then lands on sign-in saying so and comes back after', async () => {
    const here = await pageAs('observer@demo.invalid');
    const elsewhere = await pageAs('observer@demo.invalid');
    await here.getByRole('link', { name: 'Sessions', exact: true }).click();
    await here.getByRole('heading', { name: 'Where you are signed in', level: 1 }).waitFor();
    const list = here.getByRole('list', { name: 'Your sessions' });
    await expect.poll(() => list.getByRole('listitem').count()).toBe(2);
    expect(await list.locator('[data-current="yes"]').getByText('This browser').count()).toBe(1);
    // Playwright's headless Chromium names itself HeadlessChrome in its user agent; bowser reads it as Chrome on Linux.
    expect(await list.locator('[data-current="yes"] h3').innerText()).toMatch(/^Chrome \d+ on Linux/);
    await here.getByText('A session ends by itself 12 hours after signing in, or after 30 minutes without use.', { exact: false }).waitFor();

    for (const theme of ['day', 'night'] as const) {
      await here.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
      for (const width of [390, 1366]) {
        await here.setViewportSize({ width, height: 900 });
        await here.reload();
        await list.getByText('This browser').waitFor();
        expect(await here.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
        expect(await axeViolations(here), `${theme} ${width}`).toEqual([]);
        if (width === 390) expect(await here.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
        await screenshot(here, `account-sessions-${theme}-${width}`);
      }
    }

    await elsewhere.goto(`${app.baseUrl}/account/tokens`);
    await elsewhere.getByRole('heading', { name: 'API tokens', level: 1 }).waitFor();
    const other = list.locator('[data-current="no"]');
    await other.getByRole('button', { name: /^End this session \(/ }).click();
    // Ending a session asks for the password again (ASVS 3.3.4); without it the refusal is named at the field.
    await other.getByRole('button', { name: 'Yes, end it' }).click();
    await other.getByText('Confirm with your current password.').waitFor();
    expect(await other.getByLabel('Confirm with your password', { exact: true }).getAttribute('aria-invalid')).toBe('true');
    expect(await axeViolations(here)).toEqual([]);
    await screenshot(here, 'account-sessions-confirm-1366');
    await other.getByLabel('Confirm with your password', { exact: true }).fill('observer-demo-2026');
    await other.getByRole('button', { name: 'Yes, end it' }).click();
    await expect.poll(() => list.getByRole('listitem').count()).toBe(1);

    // The other browser's next request is refused; nothing was typed there, so it goes straight to sign-in, saying why.
    await elsewhere.getByRole('link', { name: 'Sessions', exact: true }).click();
    await elsewhere.waitForURL((url) => url.pathname === '/sign-in');
    await elsewhere.getByText('Your session has ended. Sign in again.').waitFor();
    expect(new URL(elsewhere.url()).searchParams.get('redirectTo')).toBe('/account/sessions');
    await screenshot(elsewhere, 'session-ended-sign-in-1366');
    await elsewhere.getByLabel(/e-mail/i).fill('observer@demo.invalid');
    await elsewhere.getByLabel(/password/i).fill('observer-demo-2026');
    await elsewhere.getByRole('button', { name: /sign in/i }).click();
    await elsewhere.getByRole('heading', { name: 'Where you are signed in', level: 1 }).waitFor();
    expect(new URL(elsewhere.url()).pathname).toBe('/account/sessions');
  });

  it('a form half-filled when the session runs out of idle time stays, says the session ended and why, and signing in again comes back to it', async () => {
    const page = await pageAs('lead@demo.invalid', 390);
    await page.goto(`${app.baseUrl}/account/tokens`);
    const name = page.getByLabel('Token name');
    await name.fill('dome weather station');
    await page.getByLabel('Confirm with your password', { exact: true }).fill('lead-demo-2026');
    // 31 minutes without use, as the server counts it (its last-use stamp).
    await db('sessions').update({ last_seen_at: new Date(Date.now() - 31 * 60_000).toISOString() });
    await page.getByRole('button', { name: 'Create token' }).click();
    const notice = page.getByRole('alert').filter({ hasText: 'What you typed on this page is still here but has not been saved.' });
    await notice.waitFor();
    await notice.getByText('Your session ended after 30 minutes without use. Sign in again.').waitFor();
    expect(await name.inputValue()).toBe('dome weather station');
    expect(new URL(page.url()).pathname).toBe('/account/tokens');
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'session-ended-form-kept-390');

    await notice.getByRole('button', { name: 'Sign in again' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.getByText('Your session ended after 30 minutes without use. Sign in again.').waitFor();
    await page.getByLabel(/e-mail/i).fill('lead@demo.invalid');
    await page.getByLabel(/password/i).fill('lead-demo-2026');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByRole('heading', { name: 'API tokens', level: 1 }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/account/tokens');
  });

  it('a page opened afresh on a session that ran out goes to sign-in and says why', async () => {
    const page = await pageAs('pi@demo.invalid');
    await page.goto(`${app.baseUrl}/account/mail`);
    // Loaded, so that no request of this page reaches the server after the session is aged (it would end it, and the reload would find no session at all).
    await page.getByLabel('The weekly summary of this project').first().waitFor();
    await page.waitForLoadState('networkidle');
    await db('sessions').update({ last_seen_at: new Date(Date.now() - 31 * 60_000).toISOString() });
    await page.reload();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.getByText('Your session ended after 30 minutes without use. Sign in again.').waitFor();
    expect(new URL(page.url()).searchParams.get('redirectTo')).toBe('/account/mail');
  });
});
