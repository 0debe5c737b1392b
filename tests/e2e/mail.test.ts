import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

/** Waits until the mail fake's page lists a message whose subject matches, and opens it. */
async function openCaught(admin: Page, baseUrl: string, subject: RegExp, timeoutMs = 20_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  await admin.goto(`${baseUrl}/admin/mail`);
  while (Date.now() < deadline) {
    const link = admin.getByTestId('caught-list').getByRole('link', { name: subject });
    if ((await admin.getByTestId('caught-list').count()) > 0 && (await link.count()) > 0) {
      await link.first().click();
      return;
    }
    await admin.waitForTimeout(1000);
    await admin.reload();
  }
  throw new Error(`no message matching ${subject} reached the mail fake within ${timeoutMs} ms`);
}

describe.skipIf(!chromiumAvailable)('the weekly summary in the browser', () => {
  const { baseUrl, pageAs } = browserSuite();

  it('the PI previews the demo’s summary, sends it now, and the site admin reads it as the fake received it', async () => {
    const pi = await pageAs('pi@demo.invalid');
    await pi.goto(`${baseUrl()}/projects/1`);
    await pi.getByRole('navigation', { name: 'Project' }).getByRole('link', { name: 'Summary' }).click();
    await pi.getByRole('heading', { name: 'Weekly summary', level: 1 }).waitFor();
    await expect.poll(() => pi.getByLabel('Weekday').inputValue()).toBe('1');
    expect(await pi.getByLabel('Time').inputValue()).toBe('08:00');
    expect(await pi.getByTestId('summary-recipients').textContent()).toContain('pi@demo.invalid');

    // The preview, drawn in a sandboxed frame, carries the demo's week.
    const frame = pi.frameLocator('[data-testid="mail-html"]');
    await frame.getByRole('heading', { name: 'Values approved' }).waitFor();
    for (const section of ['Uploads received', 'Values rejected', 'Awaiting review', 'New warnings']) await frame.getByRole('heading', { name: section }).waitFor();
    expect(await frame.getByRole('link', { name: 'GW 103' }).first().getAttribute('href')).toMatch(/\/projects\/1\/targets\/\d+$/);
    expect(await pi.getByTestId('mail-html').getAttribute('sandbox')).toBe('');
    expect(await pi.getByTestId('mail-text').textContent()).toContain('AWAITING REVIEW');
    await screenshot(pi, 'mail-summary-preview');

    await pi.getByRole('button', { name: 'Send now' }).click();
    await pi.getByText(/is on its way to 1 person/).waitFor();
    await pi.getByRole('button', { name: 'Send now' }).click();
    await pi.getByText(/Everyone already has the summary/).waitFor();

    const admin = await pageAs('admin@demo.invalid');
    await openCaught(admin, baseUrl(), /Starledger weekly summary: Glasswing/);
    await admin.getByRole('heading', { name: /Starledger weekly summary: Glasswing/ }).waitFor();
    const received = admin.frameLocator('[data-testid="mail-html"]');
    await received.getByRole('heading', { name: 'Awaiting review' }).waitFor();
    expect(await admin.getByText(/to pi@demo\.invalid/).first().textContent()).toContain('pi@demo.invalid');
    expect(await admin.getByTestId('mail-text').textContent()).toMatch(/VALUES REJECTED\n1 value\./);
    await screenshot(admin, 'mail-summary-received');
    // Sent once, however often Send now was pressed.
    const subjects = await admin.evaluate(async () => ((await (await fetch('/api/admin/mail')).json()) as { messages: { subject: string }[] }).messages.map((m) => m.subject));
    expect(subjects.filter((s) => s.startsWith('Starledger weekly summary'))).toHaveLength(1);
  });

  it('a member asks for the summary under Mail preferences and is then listed as a recipient', async () => {
    const observer = await pageAs('observer@demo.invalid');
    await observer.goto(`${baseUrl()}/account/mail`);
    const box = observer.getByTestId('mail-preference-GLASSWING').getByLabel('The weekly summary of this project');
    // The box is drawn from the saved choice (shown at once, then confirmed by the server): click, then wait for it to show.
    await box.click();
    await expect.poll(() => box.isChecked()).toBe(true);
    await expect.poll(() => observer.evaluate(async () => ((await (await fetch('/api/mail-preferences')).json()) as { preferences: { weeklySummary: boolean }[] }).preferences[0].weeklySummary)).toBe(true);
    await screenshot(observer, 'mail-preferences');
    const lead = await pageAs('lead@demo.invalid');
    await lead.goto(`${baseUrl()}/projects/1/summary`);
    await expect.poll(async () => (await lead.getByTestId('summary-recipients').textContent()) ?? '').toContain('observer@demo.invalid');
  });
});
