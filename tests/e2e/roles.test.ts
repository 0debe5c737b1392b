import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoAccounts } from '../../seeds/01-demo-scenario';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/** What each demo role sees and can do, as its users would, in Chromium against the production build. */
describe.skipIf(!chromiumAvailable)('each role in the browser', () => {
  const { baseUrl, newPage, pageAs } = browserSuite();

  const account = (email: string) => demoAccounts.find((a) => a.email === email)!;


  /** Opens the demo project and waits until the page knows the caller's role, so absent controls are truly absent. */
  async function openProject(page: Page) {
    await page.getByRole('link', { name: /Glasswing Nearby Dwarfs Programme/ }).first().click();
    await page.getByRole('table', { name: 'Targets' }).waitFor();
    await page.getByRole('link', { name: 'GW 101', exact: true }).waitFor();
    await page.getByText(/Your role: /).waitFor();
  }

  it('refuses a wrong password without saying whether the account exists', async () => {
    const page = await newPage();
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByLabel('E-mail').fill('lead@demo.invalid');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('That e-mail and password do not match an account.').waitFor();
    await screenshot(page, 'sign-in-refused');
    expect(page.url()).toContain('/sign-in');
  });

  it('lead: sees the project, adds a target, and manages members', async () => {
    const page = await pageAs('lead@demo.invalid');
    await openProject(page);
    await page.getByRole('link', { name: 'Add target' }).click();
    await page.getByLabel('Designation').fill('GW 125');
    await page.getByLabel('Right ascension (J2000)').fill('18 02 11.4');
    await page.getByLabel('Declination (J2000)').fill('-31 40 07');
    await page.getByRole('button', { name: /save|add target|create/i }).last().click();
    await page.getByRole('heading', { name: 'GW 125' }).waitFor();
    await page.getByText('18 02 11.40').first().waitFor();
    await page.getByRole('link', { name: 'Edit target' }).waitFor();
    await page.getByRole('button', { name: 'Delete target' }).waitFor();
    await screenshot(page, 'lead-target-created');
    await page.getByRole('link', { name: 'Members', exact: true }).click();
    await page.getByRole('button', { name: 'Add member' }).waitFor();
    await page.getByRole('button', { name: /^Remove / }).first().waitFor();
    await screenshot(page, 'lead-members');
  });

  it('observer: edits targets but does not manage members', async () => {
    const page = await pageAs('observer@demo.invalid');
    await openProject(page);
    await page.getByRole('link', { name: 'Add target' }).waitFor();
    await page.getByRole('link', { name: 'Members', exact: true }).click();
    await page.getByRole('table', { name: 'Members' }).getByRole('cell', { name: /Mireille Castaway/ }).first().waitFor();
    expect(await page.getByRole('button', { name: 'Add member' }).count()).toBe(0);
    await screenshot(page, 'observer-members');
  });

  for (const email of ['reader@demo.invalid', 'pi@demo.invalid']) {
    it(`${account(email).role}: reads the targets and sees no edit controls`, async () => {
      const page = await pageAs(email);
      await openProject(page);
      expect(await page.getByRole('link', { name: 'Add target' }).count()).toBe(0);
      await screenshot(page, `${account(email).role}-project`);
      await page.getByRole('link', { name: 'GW 101', exact: true }).click();
      await page.getByRole('heading', { name: 'GW 101' }).waitFor();
      await page.getByRole('heading', { name: 'Derived values' }).waitFor();
      expect(await page.getByRole('link', { name: 'Edit target' }).count()).toBe(0);
      expect(await page.getByRole('button', { name: 'Delete target' }).count()).toBe(0);
      await page.goto(`${baseUrl()}/projects/1/targets/new`);
      await page.getByRole('heading', { name: 'Your role does not allow this' }).waitFor();
      await screenshot(page, `${account(email).role}-new-target-forbidden`);
    });
  }

  it('site admin: creates a project, with the server’s refusal shown at its field, and sees the accounts', async () => {
    const page = await pageAs('admin@demo.invalid');
    const form = page.getByRole('form', { name: 'New project' });
    await form.getByLabel('Name', { exact: true }).fill('Winter photometry');
    await form.getByLabel('Code').fill('WNT-26');
    await form.getByLabel('Site name').fill('North Dome');
    await form.getByLabel('Time zone').fill('Etc/UTC');
    await form.getByLabel('Latitude (°)').fill('52.1');
    await form.getByLabel('Longitude (°)').fill('-3.4');
    await form.getByLabel('Elevation (m)').fill('320');
    const leadEmail = form.getByLabel('Lead astronomer’s e-mail');
    await leadEmail.fill('nobody@demo.invalid');
    await form.getByRole('button', { name: 'Create project' }).click();
    // Only the server knows which accounts exist: its refusal must land at the field it names.
    await form.getByText('No account has that e-mail. Create the account first.').waitFor();
    expect(await leadEmail.getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'admin-project-refused');
    await leadEmail.fill('');
    await form.getByRole('button', { name: 'Create project' }).click();
    await form.getByText('Project WNT-26 created.').waitFor();
    await screenshot(page, 'admin-project-created');
    await page.goto(`${baseUrl()}/admin/users`);
    await page.getByRole('table', { name: 'Accounts' }).waitFor();
    await page.getByRole('cell', { name: 'observer@demo.invalid' }).waitFor();
    await screenshot(page, 'admin-users');
  });

  it('keeps the night theme across a reload', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.getByRole('button', { name: 'Night theme' }).click();
    await page.reload();
    await page.getByRole('button', { name: 'Night theme' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('night');
    await openProject(page);
    await screenshot(page, 'observer-night-project');
  });

  it('calculator: derives the Wien temperature from a peak wavelength as it is typed', async () => {
    const page = await pageAs('reader@demo.invalid');
    await page.getByRole('link', { name: 'Calculator' }).click();
    await page.getByLabel('Continuum peak wavelength', { exact: true }).fill('500');
    await page.getByLabel('Uncertainty (1σ) of Continuum peak wavelength', { exact: true }).fill('5');
    const derived = page.getByRole('region', { name: 'Derived values' });
    // T = b / λ = 2.897771955e-3 m K / 500e-9 m = 5795.5 K (CODATA 2018 b); σ = T × 5/500 = 58 K;
    // the sheet rounds σ to one figure and the value to match: 5800 ± 60 K.
    await derived.getByText('5800 ± 60 K').first().waitFor();
    await screenshot(page, 'calculator-wien');
  });
});
