import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoProject } from '../../seeds/01-demo-scenario';
import { browserSuite, chromiumAvailable } from './support/harness';

/** Everything the page's origin keeps in the browser beyond cookies: Web Storage, IndexedDB, Cache Storage and service workers. */
async function storedInBrowser(page: Page) {
  return page.evaluate(async () => ({
    local: Object.fromEntries(Object.keys(localStorage).map((k) => [k, localStorage.getItem(k)])),
    session: Object.keys(sessionStorage),
    indexedDb: (await indexedDB.databases()).map((d) => d.name),
    caches: await caches.keys(),
    serviceWorkers: (await navigator.serviceWorker.getRegistrations()).length,
  }));
}

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe.skipIf(!chromiumAvailable)('what the browser keeps', () => {
  const { pageAs, newPage, baseUrl } = browserSuite();

  it('after signing in and opening pages, the browser’s storage holds only the theme and dim choice (ASVS 8.2.2)', async () => {
    const page = await pageAs('observer@demo.invalid');
    await page.getByText(demoProject.name).first().waitFor();
    await page.getByText(demoProject.name).first().click();
    await page.waitForLoadState('networkidle');
    await page.goto(`${baseUrl()}/account/password`);
    await page.getByRole('heading', { name: 'Password', level: 1 }).waitFor();
    const stored = await storedInBrowser(page);
    expect(Object.keys(stored.local).every((k) => ['starledger.theme', 'starledger.dim'].includes(k)), JSON.stringify(stored.local)).toBe(true);
    expect(JSON.stringify(stored.local)).not.toMatch(/observer|csrf|token|sid|demo/i);
    expect(stored.session).toEqual([]);
    expect(stored.indexedDb).toEqual([]);
    expect(stored.caches).toEqual([]);
    expect(stored.serviceWorkers).toBe(0);
    // The session cookie is out of the page's reach (HttpOnly).
    expect(await page.evaluate(() => document.cookie)).not.toContain('starledger.sid');
  });

  it('after signing out, Back shows no page of the session: the data is gone from the page’s cache and the server answers 401 (ASVS 8.2.3)', async () => {
    const page = await pageAs('observer@demo.invalid');
    const projects = await page.evaluate(async () => (await (await fetch('/api/projects')).json()) as { projects?: { id: number; code: string }[] });
    const project = (projects.projects ?? (projects as unknown as { id: number; code: string }[])).find((p) => p.code === demoProject.code)!;
    const projectUrl = `${baseUrl()}/projects/${project.id}`;
    // In every document from here on (and in one the browser restores from its back-forward cache, by pageshow),
    // note each moment the project's data is drawn; after sign-out there must be none.
    let watching = false;
    const shownAfterSignOut: string[] = [];
    let shownBefore = 0;
    await page.exposeFunction('noteProjectShown', (url: string) => {
      if (watching) shownAfterSignOut.push(url);
      else shownBefore += 1;
    });
    await page.addInitScript((name) => {
      const check = () => {
        if (document.body?.innerText.includes(name)) (window as unknown as { noteProjectShown(url: string): void }).noteProjectShown(location.href);
      };
      new MutationObserver(check).observe(document, { childList: true, subtree: true, characterData: true });
      addEventListener('pageshow', check);
    }, demoProject.name);
    await page.goto(projectUrl);
    await page.getByText(demoProject.name).first().waitFor();
    // The watcher sees the project while it is drawn, so its silence later means something.
    await expect.poll(() => shownBefore).toBeGreaterThan(0);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
    watching = true;
    await page.goBack();
    // Back lands on the project's address, whose page finds no data and no session and goes to sign-in.
    await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
    await page.getByRole('button', { name: /sign in/i }).waitFor();
    expect(await page.getByText(demoProject.name).count()).toBe(0);
    expect(shownAfterSignOut).toEqual([]);
    // Opened afresh by its address the page is no better off.
    await page.goto(projectUrl);
    await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
    await page.getByRole('button', { name: /sign in/i }).waitFor();
    expect(await page.getByText(demoProject.name).count()).toBe(0);
    const api = await page.evaluate(async () => (await fetch('/api/projects')).status);
    expect(api).toBe(401);
  });

  it('a password can be pasted into every password field, and each carries the autocomplete a password manager reads (ASVS 2.1.11; WHATWG HTML §4.10.18.7.1)', async () => {
    const page = await newPage();
    await page.context().grantPermissions(['clipboard-read', 'clipboard-write'], { origin: baseUrl() });
    await page.goto(`${baseUrl()}/sign-in`);
    const email = page.getByLabel(/e-mail/i);
    const password = page.getByLabel('Password', { exact: true });
    expect(await email.getAttribute('autocomplete')).toBe('username');
    expect(await password.getAttribute('autocomplete')).toBe('current-password');
    await email.fill('observer@demo.invalid');
    await page.evaluate(() => navigator.clipboard.writeText('observer-demo-2026'));
    await password.focus();
    await page.keyboard.press('ControlOrMeta+V');
    expect(await password.inputValue()).toBe('observer-demo-2026');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));

    await page.goto(`${baseUrl()}/account/password`);
    const form = page.getByRole('form', { name: 'Change your password' });
    const fields = { 'Current password': 'current-password', 'New password': 'new-password', 'The new password again': 'new-password' };
    await page.evaluate(() => navigator.clipboard.writeText('pasted lantern phrase'));
    for (const [label, autocomplete] of Object.entries(fields)) {
      const field = form.getByLabel(label, { exact: true });
      expect(await field.getAttribute('autocomplete'), label).toBe(autocomplete);
      await field.focus();
      await page.keyboard.press('ControlOrMeta+V');
      expect(await field.inputValue(), label).toBe('pasted lantern phrase');
    }
    // A password manager pairs the password with the account by the username field beside it.
    expect(await form.locator('input[autocomplete="username"]').getAttribute('value')).toBe('observer@demo.invalid');
  });
});
