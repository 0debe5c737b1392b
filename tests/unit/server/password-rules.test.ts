import { describe, expect, it } from 'vitest';
import { passwordProblem } from '../../../server/lib/passwords';
import { demoAccounts } from '../../../seeds/01-demo-scenario';

const lead = { email: 'lead@demo.invalid', name: 'Tobiah Ferrand' };

describe('what a new password may be', () => {
  it('refuses fewer than 12 characters and more than 128, and takes 12, a 64-character passphrase with spaces and 128 characters (ASVS 4.0 2.1.1, 2.1.2, 2.1.9)', () => {
    expect(passwordProblem('eleven-char', lead)).toMatch(/at least 12 characters/);
    expect(passwordProblem('twelve-chars', lead)).toBeUndefined();
    const phrase = 'the red lamp over the dome stays lit until the last plate is done';
    expect(phrase.length).toBe(65);
    expect(passwordProblem(phrase, lead)).toBeUndefined();
    expect(passwordProblem('x7'.repeat(64), lead)).toBeUndefined();
    expect(passwordProblem('x7'.repeat(64) + 'y', lead)).toMatch(/at most 128 characters/);
    // Counted in characters (zod's string length, UTF-16 units), not bytes: 128 kanji pass (384 bytes in UTF-8), 129 do not.
    expect(passwordProblem('星'.repeat(128), lead)).toBeUndefined();
    expect(passwordProblem('星'.repeat(129), lead)).toMatch(/at most 128 characters/);
  });

  it('refuses common passwords of any case (fxa-common-password-list)', () => {
    for (const common of ['aaaaaaaaaaaa', '123456789012', 'password1234', 'PASSWORD1234', 'qwertyuiopasdfgh', 'passwordpassword']) {
      expect(passwordProblem(common, lead), common).toMatch(/most common passwords/);
    }
  });

  it("refuses a password made of the account's e-mail, name or the product's name with digits and symbols", () => {
    for (const own of ['lead@demo.invalid', 'LEAD@DEMO.INVALID', 'starledger2026', 'Starledger!Starledger', 'Tobiah.Ferrand!1', 'ferrand-2026-tobiah', 'lead1234567890']) {
      expect(passwordProblem(own, lead), own).toMatch(/your e-mail, your name or "Starledger"/);
    }
  });

  it('takes phrases that merely include such a word, and the demo passwords', () => {
    expect(passwordProblem('lead-demo-2026', lead)).toBeUndefined();
    expect(passwordProblem('starledger at the summit', lead)).toBeUndefined();
    for (const account of demoAccounts) expect(passwordProblem(account.password, account), account.email).toBeUndefined();
  });
});
