import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, screenshot, signInAs } from './support/harness';

/** The strength meter's words under a password field, which the field names in aria-describedby: a polite live region (WAI-ARIA 1.2, aria-live) that says it in text. */
async function meterOf(page: Page, label: string) {
  const input = page.getByLabel(label, { exact: true });
  const id = await input.getAttribute('id');
  expect((await input.getAttribute('aria-describedby'))?.split(' ')).toContain(`${id}-strength`);
  return page.locator(`[id="${id}-strength"] p[aria-live="polite"]`);
}

/**
 * A site admin makes an account under Accounts with a first password (the
 * meter under it), and its owner, signing in with it, must choose their own
 * before anything else (ASVS 2.1.8, 2.3.1), in Chromium against the build.
 */
describe.skipIf(!chromiumAvailable)('choosing a password with a strength meter', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('shows the strength in words under a new password, and sends an account made by a site admin to choose its own password first, by day and night at 390 and 1366 px', async () => {
    const admin = await pageAs('admin@demo.invalid');
    await admin.goto(`${baseUrl()}/admin/users`);
    const form = admin.getByRole('form', { name: 'New account' });
    await form.getByLabel('Name').fill('Ilsabet Wren');
    await form.getByLabel('E-mail').fill('ilsabet.wren@demo.invalid');
    const first = await meterOf(admin, 'First password');
    expect(await first.innerText()).toBe('Strength: shown as you type.');
    // zxcvbn's own README and paper (Wheeler, USENIX Security 2016) score "password" 0: among the first guesses.
    await form.getByLabel('First password', { exact: true }).fill('password');
    await expect.poll(() => first.innerText()).toMatch(/^Strength: very weak\. This is a heavily used password\./);
    await form.getByLabel('First password', { exact: true }).fill('given by the admin once');
    await expect.poll(() => first.innerText()).toMatch(/^Strength: (strong|very strong)\.$/);
    expect(await axeViolations(admin)).toEqual([]);
    await screenshot(admin, 'password-strength-new-account-1366');
    // The new account is confirmed with the site admin's own password (ASVS 4.3.3).
    await form.getByLabel('Confirm with your password', { exact: true }).fill('admin-demo-2026');
    await form.getByRole('button', { name: 'Create account' }).click();
    await form.getByText('Account for Ilsabet Wren (ilsabet.wren@demo.invalid) created.').waitFor();

    const owner = await newPage();
    await signInAs(owner, baseUrl(), 'ilsabet.wren@demo.invalid', 'given by the admin once');
    await owner.getByRole('heading', { name: 'Choose a new password', level: 1 }).waitFor();
    await owner.getByText('A site admin chose the password you signed in with.', { exact: false }).waitFor();
    // Nothing of the workbook is offered until then.
    expect(await owner.getByRole('link', { name: 'Password', exact: true }).count()).toBe(0);

    for (const theme of ['day', 'night'] as const) {
      await owner.evaluate((t) => window.localStorage.setItem('starledger.theme', t), theme);
      for (const width of [390, 1366]) {
        await owner.setViewportSize({ width, height: 900 });
        await owner.reload();
        await owner.getByRole('heading', { name: 'Choose a new password', level: 1 }).waitFor();
        expect(await owner.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
        await owner.getByLabel('New password', { exact: true }).fill('ilsabet.wren');
        const meter = await meterOf(owner, 'New password');
        await expect.poll(() => meter.innerText()).toMatch(/^Strength: (very weak|weak|fair)\./);
        expect(await axeViolations(owner), `${theme} ${width}`).toEqual([]);
        if (width === 390) expect(await owner.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
        await screenshot(owner, `password-change-required-${theme}-${width}`);
      }
    }

    const change = owner.getByRole('form', { name: 'Change your password' });
    await change.getByLabel('Current password').fill('given by the admin once');
    await change.getByLabel('New password', { exact: true }).fill('given by the admin once');
    await change.getByLabel('The new password again').fill('given by the admin once');
    await change.getByRole('button', { name: 'Change the password' }).click();
    await change.getByText('Choose a password other than your current one.').waitFor();
    await change.getByLabel('New password', { exact: true }).fill('my own words for the dome');
    await change.getByLabel('The new password again').fill('my own words for the dome');
    await change.getByRole('button', { name: 'Change the password' }).click();
    await owner.getByRole('heading', { name: 'Choose a new password', level: 1 }).waitFor({ state: 'detached' });
    await owner.getByRole('link', { name: 'Password', exact: true }).waitFor();
  });
});
