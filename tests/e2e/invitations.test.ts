import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot, signInAs } from './support/harness';
import { apiWrite, linkFromMail } from './support/mail';

/**
 * Invitations and password resets in Chromium against the production build,
 * each link read from what the local mail fake received over SMTP.
 */
describe.skipIf(!chromiumAvailable)('invitations and password resets in the browser', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('the lead invites an address from the members page, the invitee opens the mailed link, creates an account and lands in the project; the link then refuses', async () => {
    const lead = await pageAs('lead@demo.invalid');
    const admin = await pageAs('admin@demo.invalid');
    await lead.goto(`${baseUrl()}/projects/1/members`);
    const form = lead.getByRole('form', { name: 'Invite by e-mail' });
    await form.getByLabel('E-mail').fill('vesna.ardent@demo.invalid');
    await form.getByLabel('Role').selectOption('observer');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await lead.getByText('Invitation for vesna.ardent@demo.invalid as Observer sent').waitFor();
    const waiting = lead.getByRole('table', { name: 'Invitations waiting for an answer' });
    await waiting.getByRole('cell', { name: 'vesna.ardent@demo.invalid', exact: true }).waitFor();
    await screenshot(lead, 'invitation-1-members-page');

    const mail = await linkFromMail(admin, 'vesna.ardent@demo.invalid', 'invitation');
    expect(mail.subject).toBe('Starledger: Tobiah Ferrand invites you to Glasswing Nearby Dwarfs Programme');
    expect(mail.text).toContain('as observer');
    const mailView = await newPage();
    await mailView.setContent(mail.html);
    await screenshot(mailView, 'invitation-2-mail');

    const guest = await newPage();
    await guest.setViewportSize({ width: 390, height: 844 });
    await guest.goto(`${baseUrl()}${mail.path}`);
    await guest.getByText('invites vesna.ardent@demo.invalid to Glasswing Nearby Dwarfs Programme').waitFor();
    await screenshot(guest, 'invitation-3-open-390');
    await guest.getByLabel('Your name').fill('Vesna Ardent');
    await guest.getByLabel('Password', { exact: true }).fill('ardent-skies-2026');
    await guest.getByLabel('The same again').fill('ardent-skies-2027');
    await guest.getByRole('button', { name: 'Create my account and join' }).click();
    await guest.getByText('The two passwords differ.').waitFor();
    await guest.getByLabel('The same again').fill('ardent-skies-2026');
    await guest.getByRole('button', { name: 'Create my account and join' }).click();
    await guest.waitForURL(`${baseUrl()}/projects/1`);
    await guest.getByRole('button', { name: 'Vesna Ardent' }).or(guest.getByText('Vesna Ardent')).first().waitFor();
    await screenshot(guest, 'invitation-4-joined-390');

    await guest.goto(`${baseUrl()}${mail.path}`);
    await guest.getByText('This invitation has already been accepted.').waitFor();
    await screenshot(guest, 'invitation-5-reused-390');

    await lead.reload();
    await lead.getByRole('table', { name: 'Members' }).getByRole('cell', { name: 'vesna.ardent@demo.invalid', exact: true }).waitFor();
    // The invitations list is its own request, answered after the members table or before it.
    await expect.poll(() => lead.getByText('No invitation is waiting for an answer.').count()).toBe(1);

    // The new account signs in with the password it chose.
    const again = await newPage();
    await signInAs(again, baseUrl(), 'vesna.ardent@demo.invalid', 'ardent-skies-2026');
    expect(new URL(again.url()).pathname).toBe('/');
  });

  it('someone with an account signs in on the invitation page and the project joins their list', async () => {
    const lead = await pageAs('lead@demo.invalid');
    const admin = await pageAs('admin@demo.invalid');
    const made = await apiWrite(lead, 'POST', '/projects/1/invitations', { email: 'admin@demo.invalid', role: 'reader' });
    expect(made.status).toBe(201);
    const mail = await linkFromMail(admin, 'admin@demo.invalid', 'invitation');
    const visitor = await newPage();
    await visitor.goto(`${baseUrl()}${mail.path}`);
    await visitor.getByText('admin@demo.invalid already has a Starledger account').waitFor();
    await screenshot(visitor, 'invitation-6-existing-account');
    await visitor.getByLabel('E-mail').fill('admin@demo.invalid');
    await visitor.getByLabel('Password').fill('admin-demo-2026');
    await visitor.getByRole('button', { name: 'Sign in' }).click();
    await visitor.getByRole('button', { name: 'Accept and join the project' }).click();
    await visitor.waitForURL(`${baseUrl()}/projects/1`);
    const me = await visitor.evaluate(async () => (await (await fetch('/api/auth/me')).json()) as { memberships: { projectId: number; role: string }[] });
    expect(me.memberships).toContainEqual({ projectId: 1, role: 'reader' });
  });

  it('a withdrawn invitation and an unknown link are refused, each with its own message', async () => {
    const lead = await pageAs('lead@demo.invalid');
    const admin = await pageAs('admin@demo.invalid');
    await apiWrite(lead, 'POST', '/projects/1/invitations', { email: 'withdrawn@demo.invalid', role: 'reader' });
    const mail = await linkFromMail(admin, 'withdrawn@demo.invalid', 'invitation');
    await lead.goto(`${baseUrl()}/projects/1/members`);
    await lead.getByRole('button', { name: 'Withdraw the invitation for withdrawn@demo.invalid' }).click();
    await lead.getByText('No invitation is waiting for an answer.').waitFor();
    const visitor = await newPage();
    await visitor.goto(`${baseUrl()}${mail.path}`);
    await visitor.getByText('This invitation was withdrawn by the project’s lead astronomer.').waitFor();
    await screenshot(visitor, 'invitation-7-withdrawn');
    await visitor.goto(`${baseUrl()}/invitation#${'Q'.repeat(43)}`);
    await visitor.getByText('Error: This link is not known.', { exact: true }).waitFor();
    await visitor.getByText('Open it again from the e-mail').waitFor();
  });

  it('a forgotten password is reset from the mailed link: other sessions end, the old password stops working, the link refuses a second use', async () => {
    const admin = await pageAs('admin@demo.invalid');
    const elsewhere = await pageAs('observer@demo.invalid');
    const page = await newPage();
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByRole('heading', { name: 'Forgot your password?' }).waitFor();
    await page.getByLabel('E-mail').fill('observer@demo.invalid');
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await page.getByText('If an account has this address, a message with a link').waitFor();
    await screenshot(page, 'reset-1-requested');

    const mail = await linkFromMail(admin, 'observer@demo.invalid', 'reset-password');
    const mailView = await newPage();
    await mailView.setContent(mail.html);
    await screenshot(mailView, 'reset-2-mail');

    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`${baseUrl()}${mail.path}`);
    await page.getByText('observer@demo.invalid', { exact: true }).waitFor();
    await screenshot(page, 'reset-3-form-390');
    await page.getByLabel('New password', { exact: true }).fill('short');
    await page.getByLabel('The same again').fill('short');
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByText('Use at least 12 characters; a few words together make a good password.').waitFor();
    await page.getByLabel('New password', { exact: true }).fill('nightfall-observer-2026');
    await page.getByLabel('The same again').fill('nightfall-observer-2026');
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByText('Your new password is set.').waitFor();
    await screenshot(page, 'reset-4-done-390');

    // The observer's session in another browser has ended.
    await elsewhere.reload();
    await elsewhere.waitForURL(/\/sign-in/);

    await page.reload();
    await page.getByText('This link has already been used to set a password.').waitFor();
    await screenshot(page, 'reset-5-reused-390');

    const fresh = await newPage();
    await fresh.goto(`${baseUrl()}/sign-in`);
    await fresh.getByLabel('E-mail').fill('observer@demo.invalid');
    await fresh.getByLabel('Password').fill('observer-demo-2026');
    await fresh.getByRole('button', { name: 'Sign in' }).click();
    await fresh.getByText('That e-mail and password do not match an account.').waitFor();
    await signInAs(fresh, baseUrl(), 'observer@demo.invalid', 'nightfall-observer-2026');
  });
});
