import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { Secret, TOTP } from 'otpauth';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, launchBrowser, screenshot, signInAs, startApp, type RunningApp } from './support/harness';

/**
 * The second factor in Chromium against the build: enrolment from the secret
 * shown as text, the recovery codes saved, sign-in with the password and then
 * a code, a wrong code named at its field, a new API token confirmed with
 * the password, and a site admin page closed without a second factor.
 */

/** RFC 6238's defaults (HMAC-SHA-1, six digits, 30-second steps), as an authenticator app computes them from the typed secret. */
const totp = (secret: string) => new TOTP({ secret: Secret.fromBase32(secret), digits: 6, period: 30, algorithm: 'SHA1' });
const stepNow = () => Math.floor(Date.now() / 30_000);

/** A code is taken once (ASVS 2.8.4): a second sign-in in the same 30-second step waits for the next step's code, as a person would. */
async function codeAfter(secret: string, takenStep: number): Promise<string> {
  while (stepNow() <= takenStep) await new Promise((r) => setTimeout(r, 500));
  return totp(secret).generate();
}

async function startSignIn(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel(/e-mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.getByRole('form', { name: 'Sign-in code' }).waitFor();
}

async function eachLook(page: Page, name: string, show: () => Promise<void>) {
  for (const theme of ['day', 'night'] as const) {
    await page.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
    for (const width of [390, 1366]) {
      await page.setViewportSize({ width, height: 900 });
      await show();
      expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
      expect(await axeViolations(page), `${name} ${theme} ${width}`).toEqual([]);
      if (width === 390) expect(await page.evaluate(() => document.documentElement.scrollWidth), `${name} ${theme} 390`).toBeLessThanOrEqual(390);
      await screenshot(page, `${name}-${theme}-${width}`);
    }
  }
}

describe.skipIf(!chromiumAvailable)('the second factor in the browser', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('is turned on from the secret as text, gives recovery codes to copy or download, then sign-in asks for a code after the password, a wrong code is named at the field, and a new token asks for the password', async () => {
    const page = await pageAs('observer@demo.invalid');
    const secretText = page.getByTestId('second-factor-secret');
    const turnOn = async () => {
      await page.goto(`${baseUrl()}/account/second-factor`);
      await page.getByRole('button', { name: 'Turn on the second factor' }).click();
      await secretText.waitFor();
      await page.getByRole('img', { name: /QR code of your new Starledger secret/ }).waitFor();
    };
    // Each look makes a new secret (the last one made is the one being enrolled).
    await eachLook(page, 'second-factor-enrol', turnOn);
    const secret = (await secretText.innerText()).replace(/\s+/g, '');
    expect(secret).toMatch(/^[A-Z2-7]{32}$/);

    const confirm = page.getByRole('form', { name: 'Confirm the second factor' });
    await confirm.getByLabel('Confirm with your password', { exact: true }).fill('observer-demo-2026');
    await confirm.getByLabel('Code from your authenticator app').fill('12345');
    await confirm.getByRole('button', { name: 'Turn it on' }).click();
    await confirm.getByText('Type the six digits your authenticator app shows now.').waitFor();
    const enrolStep = stepNow();
    await confirm.getByLabel('Code from your authenticator app').fill(totp(secret).generate());
    await confirm.getByRole('button', { name: 'Turn it on' }).click();

    const codes = page.getByRole('list', { name: 'Recovery codes' }).getByRole('listitem');
    await expect.poll(() => codes.count()).toBe(10);
    const recoveryCodes = await codes.allInnerTexts();
    for (const c of recoveryCodes) expect(c).toMatch(/^[A-Z2-9]{5}-[A-Z2-9]{5}$/);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'second-factor-recovery-codes-1366');
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Download as / }).click()]);
    expect(download.suggestedFilename()).toBe('starledger-recovery-codes.txt');
    const saved = fs.readFileSync((await download.path())!, 'utf8');
    for (const c of recoveryCodes) expect(saved).toContain(c);
    await page.getByRole('button', { name: 'I have kept them' }).click();
    await page.getByText('10 recovery codes left unused.').waitFor();

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await eachLook(page, 'second-factor-sign-in-code', () => startSignIn(page, baseUrl(), 'observer@demo.invalid', 'observer-demo-2026'));
    const step = page.getByRole('form', { name: 'Sign-in code' });
    const field = step.getByLabel('Code from your authenticator app');
    expect(await field.getAttribute('autocomplete')).toBe('one-time-code');
    expect(await field.getAttribute('inputmode')).toBe('numeric');
    const right = await codeAfter(secret, enrolStep);
    await field.fill(right === '000000' ? '000001' : '000000');
    await step.getByRole('button', { name: 'Sign in', exact: true }).click();
    await step.getByText('This is not a current code or an unused recovery code.').waitFor();
    expect(await field.getAttribute('aria-invalid')).toBe('true');
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'second-factor-wrong-code-night-1366');
    await field.fill(right);
    await step.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/');

    // A recovery code in another browser signs in once.
    const other = await newPage();
    await startSignIn(other, baseUrl(), 'observer@demo.invalid', 'observer-demo-2026');
    await other.getByRole('button', { name: 'Use a recovery code instead' }).click();
    await other.getByLabel('Recovery code').fill(recoveryCodes[0]!);
    await other.getByRole('button', { name: 'Sign in', exact: true }).click();
    await other.waitForURL((url) => url.pathname === '/');

    // A new API token is confirmed with the password (or a code), the refusal named at that field.
    await page.goto(`${baseUrl()}/account/tokens`);
    const form = page.getByRole('form', { name: 'Create a token' });
    await form.getByLabel('Token name').fill('dome pipeline');
    await form.getByRole('button', { name: 'Create token' }).click();
    const confirmation = form.getByLabel('Confirm with your password (or a code)', { exact: true });
    await form.getByText('Confirm with your current password or a code from your authenticator app.').waitFor();
    expect(await confirmation.getAttribute('aria-invalid')).toBe('true');
    await confirmation.fill('not the password at all');
    await form.getByRole('button', { name: 'Create token' }).click();
    await form.getByText('This is not your current password.').waitFor();
    await confirmation.fill('observer-demo-2026');
    await form.getByRole('button', { name: 'Create token' }).click();
    await page.getByTestId('new-token').waitFor();
    expect(await page.getByTestId('new-token').inputValue()).toMatch(/^slt_/);

    await page.goto(`${baseUrl()}/account/second-factor`);
    await page.getByText('9 recovery codes left unused.').waitFor();
  }, 180_000);
});

describe.skipIf(!chromiumAvailable)('site admin pages where the second factor is required (ADMIN_SECOND_FACTOR=required)', () => {
  let app: RunningApp;
  let browser: Browser;
  beforeAll(async () => {
    app = await startApp({ env: { ADMIN_SECOND_FACTOR: 'required' } });
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  it('say so in the server’s words with the way to the Account page that turns it on', async () => {
    const page = await (await browser.newContext({ viewport: { width: 1366, height: 900 } })).newPage();
    await signInAs(page, app.baseUrl, 'admin@demo.invalid', 'admin-demo-2026');
    for (const path of ['/admin/users', '/admin/mail']) {
      await page.goto(`${app.baseUrl}${path}`);
      await page.getByRole('heading', { name: 'A second factor is needed here', level: 1 }).waitFor();
      await page.getByText('Site admin pages need a second factor. Turn it on under Account (Second factor), then come back.').waitFor();
    }
    expect(await page.getByRole('form', { name: 'New account' }).count()).toBe(0);
    expect(await axeViolations(page)).toEqual([]);
    await screenshot(page, 'second-factor-required-admin-1366');
    await page.getByRole('link', { name: 'Your account’s second factor' }).click();
    await page.getByRole('heading', { name: 'Second factor', level: 1 }).waitFor();
  });
});
