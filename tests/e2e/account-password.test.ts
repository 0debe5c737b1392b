import { describe, expect, it } from 'vitest';
import { axeViolations } from './support/axe';
import { browserSuite, chromiumAvailable, screenshot, signInAs } from './support/harness';

/** Changing one's password in Chromium against the production build. */
describe.skipIf(!chromiumAvailable)('changing my password in the browser', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('asks for the current password, names a refused new one on its field, shows it on request, and once changed signs out the other browser but not this one', async () => {
    const here = await pageAs('observer@demo.invalid');
    const elsewhere = await pageAs('observer@demo.invalid');
    await here.setViewportSize({ width: 390, height: 844 });
    await here.getByRole('link', { name: 'Password', exact: true }).click();
    await here.getByRole('heading', { name: 'Password', level: 1 }).waitFor();
    const form = here.getByRole('form', { name: 'Change your password' });

    await form.getByLabel('Current password').fill('not-my-password');
    await form.getByLabel('New password', { exact: true }).fill('lamplight over the dome');
    await form.getByLabel('The new password again').fill('lamplight over the dome');
    await form.getByRole('button', { name: 'Change the password' }).click();
    await form.getByText('This is not your current password.').waitFor();

    await form.getByLabel('Current password').fill('observer-demo-2026');
    await form.getByLabel('New password', { exact: true }).fill('observer@demo.invalid');
    await form.getByLabel('The new password again').fill('observer@demo.invalid');
    await form.getByRole('button', { name: 'Change the password' }).click();
    await form.getByText(/made of your e-mail, your name or "Starledger"/).waitFor();
    await screenshot(here, 'account-password-refused-390');

    await form.getByLabel('New password', { exact: true }).fill('lamplight over the dome');
    await form.getByLabel('The new password again').fill('lamplight over the dome');
    // Show reveals the password as typed and says so with aria-pressed (WAI-ARIA 1.2, button: a toggle button's state is aria-pressed); pressed again from the keyboard it hides it.
    const newPassword = form.getByLabel('New password', { exact: true });
    const show = form.getByRole('button', { name: 'Show new password' });
    expect(await show.getAttribute('aria-pressed')).toBe('false');
    expect(await newPassword.getAttribute('type')).toBe('password');
    await show.click();
    expect(await show.getAttribute('aria-pressed')).toBe('true');
    expect(await newPassword.getAttribute('type')).toBe('text');
    expect(await newPassword.inputValue()).toBe('lamplight over the dome');
    expect(await form.getByLabel('The new password again').getAttribute('type')).toBe('password');
    expect(await axeViolations(here)).toEqual([]);
    await screenshot(here, 'account-password-shown-390');
    await newPassword.focus();
    await here.keyboard.press('Tab');
    expect(await show.evaluate((el) => el === document.activeElement)).toBe(true);
    await here.keyboard.press('Space');
    expect(await show.getAttribute('aria-pressed')).toBe('false');
    expect(await newPassword.getAttribute('type')).toBe('password');
    await form.getByRole('button', { name: 'Change the password' }).click();
    await form.getByText('Your password is changed. Your other sessions have ended.').waitFor();
    await screenshot(here, 'account-password-changed-390');

    // This browser carries on, writes included; the other one is back at the sign-in page.
    await here.goto(`${baseUrl()}/account/mail`);
    const saved = here.waitForResponse((r) => r.url().includes('/api/') && r.request().method() !== 'GET');
    await here.getByLabel('The weekly summary of this project').first().click();
    expect((await saved).status()).toBeLessThan(300);
    await elsewhere.reload();
    await elsewhere.waitForURL((url) => url.pathname.startsWith('/sign-in'));

    const fresh = await newPage();
    await signInAs(fresh, baseUrl(), 'observer@demo.invalid', 'lamplight over the dome');
    expect(new URL(fresh.url()).pathname.startsWith('/sign-in')).toBe(false);
  });
});
