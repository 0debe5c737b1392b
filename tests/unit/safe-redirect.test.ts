import { describe, expect, it } from 'vitest';
import { safeRedirect } from '../../src/config/paths';

// OWASP ASVS 4.0.3 5.1.5: after sign-in only a path on this site is followed (docs/security.md).
// Each refused form is one a browser resolves to another host (WHATWG URL standard: "//" starts an authority, "\" counts as "/" in http URLs).
describe('where sign-in may send someone', () => {
  it('keeps a path on this site with its query and fragment', () => {
    expect(safeRedirect('/projects/3/targets?sort=ra#top')).toBe('/projects/3/targets?sort=ra#top');
  });

  it('sends anything that could lead to another site home instead', () => {
    for (const target of ['https://elsewhere.test.invalid/', '//elsewhere.test.invalid', '/\\elsewhere.test.invalid', 'javascript:alert(1)', 'elsewhere', '', null, undefined]) {
      expect(safeRedirect(target), String(target)).toBe('/');
    }
  });

  it('reads a path another host would resolve to as that other host the same way the browser does', () => {
    // The check above rests on this: both forms leave the page's host.
    for (const target of ['//elsewhere.test.invalid', '/\\elsewhere.test.invalid']) {
      expect(new URL(target, 'https://starledger.test.invalid/sign-in').host, target).toBe('elsewhere.test.invalid');
    }
  });
});
