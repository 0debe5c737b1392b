import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumAvailable, screenshot } from './support/harness';

describe.skipIf(!chromiumAvailable)('the night theme', () => {
  const { pageAs } = browserSuite();

  it('every colour is red light only, and the Dim control dims the page and is remembered', async () => {
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
