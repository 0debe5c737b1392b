import { createHmac, scryptSync } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { hashCostFor, hashPassword, needsRehash, verifyPassword } from '../../../server/lib/passwords';

const PEPPER = 'a0c4f1d29e6b7a3851c0ffee4d2b9e71a0c4f1d29e6b7a3851c0ffee4d2b9e71';

describe('the pepper (ASVS 2.4.5)', () => {
  it('a hash made with the pepper is scrypt of HMAC-SHA-256(pepper, password), says so, and verifies only with that pepper', async () => {
    const stored = await hashPassword('lantern over the ridge', PEPPER);
    const [scheme, n, r, p, salt, key] = stored.split('$');
    expect(scheme).toBe('scrypt-hmac');
    // Recomputed here with Node's own HMAC (RFC 2104 with SHA-256) and scrypt (RFC 7914), apart from server/lib/passwords.ts.
    const expected = scryptSync(createHmac('sha256', PEPPER).update('lantern over the ridge').digest(), Buffer.from(salt!, 'base64'), 32, {
      N: Number(n),
      r: Number(r),
      p: Number(p),
      maxmem: 64 * 1024 * 1024,
    });
    expect(Buffer.from(key!, 'base64').equals(expected)).toBe(true);
    expect(await verifyPassword('lantern over the ridge', stored, PEPPER)).toBe(true);
    expect(await verifyPassword('lantern over the ridge', stored)).toBe(false);
    expect(await verifyPassword('lantern over the ridge', stored, `${PEPPER.slice(0, -1)}0`)).toBe(false);
    expect(await verifyPassword('lantern over the ridgE', stored, PEPPER)).toBe(false);
  });

  it('a hash from before the pepper still verifies and is marked to be made again once there is one', async () => {
    const old = await hashPassword('lantern over the ridge');
    expect(old.startsWith('scrypt$')).toBe(true);
    expect(await verifyPassword('lantern over the ridge', old, PEPPER)).toBe(true);
    expect(needsRehash(old, PEPPER)).toBe(true);
    expect(needsRehash(old)).toBe(false);
    expect(needsRehash(await hashPassword('lantern over the ridge', PEPPER), PEPPER)).toBe(false);
    // Lower scrypt parameters than today's are made again too.
    const { N } = hashCostFor(process.env);
    expect(needsRehash(old.replace(`scrypt$${N}$`, `scrypt$${N / 2}$`))).toBe(true);
  });
});
