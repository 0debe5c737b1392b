import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { hashCostFor } from '../../server/lib/passwords';
import { makeWorld, signIn, type World, PASSWORD } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

async function accountWith(w: World, email: string, password: string) {
  const { agent, csrf } = await signIn(w.app, 'admin');
  const res = await agent.post('/api/users').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, email, name: 'Ilse Marrow', password });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}

const login = (w: World, email: string, password: string) => request(w.app).post('/api/auth/login').send({ email, password });

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('how a password is taken and kept', () => {
  it('takes emoji, kanji and spaces, and signs in with exactly that password and not a cut or folded one (ASVS 2.1.3, 2.1.4)', async () => {
    world = await makeWorld();
    const password = '🌟🔭🌌🌙✨☄️ 星空観測所 天体 — the long exposure of a winter night, still going';
    expect(Buffer.byteLength(password, 'utf8')).toBeGreaterThan(72);
    await accountWith(world, 'ilse.marrow@test.invalid', password);
    await login(world, 'ilse.marrow@test.invalid', password).expect(200);
    // bcrypt would sign this in: it reads only the first 72 bytes (OpenBSD bcrypt(3)).
    const first72Bytes = Buffer.from(password, 'utf8').subarray(0, 72).toString('utf8').replace(/\uFFFD+$/, '');
    for (const wrong of [password.slice(0, -1), first72Bytes, password.toUpperCase()]) {
      await login(world, 'ilse.marrow@test.invalid', wrong).expect(401);
    }
  });

  it('keeps only a salted scrypt hash with its parameters: a 128-bit salt of its own per account, never the password (ASVS 2.4.1, 2.4.2)', async () => {
    world = await makeWorld();
    await accountWith(world, 'ilse.marrow@test.invalid', 'the dome opens at dusk');
    await accountWith(world, 'orrin.vale@test.invalid', 'the dome opens at dusk');
    const rows: { password_hash: string }[] = await world.db('users').whereIn('email', ['ilse.marrow@test.invalid', 'orrin.vale@test.invalid']).select('password_hash');
    const parts = rows.map((r) => r.password_hash.split('$'));
    for (const [scheme, n, r, p, salt, key] of parts) {
      // scrypt as RFC 7914 names its parameters: N a power of two, r, p. The
      // test runner hashes at a lower N (vitest.config.ts); a server's cost is
      // checked in tests/unit/server/password-cost.test.ts.
      const cost = hashCostFor(process.env);
      expect([scheme, Number(n), Number(r), Number(p)]).toEqual(['scrypt', cost.N, cost.r, cost.p]);
      expect(Buffer.from(salt, 'base64').length).toBe(16);
      expect(Buffer.from(key, 'base64').length).toBe(32);
    }
    expect(parts[0][4]).not.toBe(parts[1][4]);
    expect(parts[0][5]).not.toBe(parts[1][5]);
    for (const r of rows) expect(r.password_hash).not.toContain('dome');
  });
});
