import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { fixedClock } from '../../server/lib/clock';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => {
  vi.restoreAllMocks();
  await world?.db.destroy();
});

/** The session id inside a signed express-session cookie value: `s:<id>.<signature>`, URI-encoded. */
function sessionId(res: request.Response): string {
  const cookie = ((res.headers['set-cookie'] as unknown as string[] | undefined) ?? []).find((c) => c.startsWith('starledger.sid='));
  if (!cookie) throw new Error('no session cookie was set');
  const value = decodeURIComponent(cookie.split(';')[0].slice('starledger.sid='.length));
  const m = /^s:([^.]+)\.[A-Za-z0-9+/]+$/.exec(value);
  if (!m) throw new Error(`not a signed session cookie: ${value}`);
  return m[1];
}

const login = (w: World) => request(w.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('session ids', () => {
  it('are 192 random bits: 200 sign-ins give 200 different ids of 32 base64url characters, each bit set in about half of them (ASVS 3.2.2)', { timeout: 480_000 }, async () => {
    world = await makeWorld();
    const ids: string[] = [];
    for (let i = 0; i < 200; i++) ids.push(sessionId(await login(world)));
    expect(new Set(ids).size).toBe(200);
    // 32 characters of the base64url alphabet (RFC 4648 §5) carry 6 bits each: 192 bits, past ASVS's 64.
    for (const id of ids) expect(id).toMatch(/^[A-Za-z0-9_-]{32}$/);
    // A counter, a clock or a short seed would leave bit positions fixed or skewed. For 200 fair coins a
    // count of ones outside 60–140 is 5.6 standard deviations out (binomial, sd = √50): it does not happen by chance.
    const bits = ids.map((id) => Buffer.from(id, 'base64url'));
    for (let bit = 0; bit < 192; bit++) {
      const ones = bits.filter((b) => (b[bit >> 3] >> (bit & 7)) & 1).length;
      expect(ones, `bit ${bit}`).toBeGreaterThanOrEqual(60);
      expect(ones, `bit ${bit}`).toBeLessThanOrEqual(140);
    }
  });

  it('come from Node’s crypto.randomBytes, the operating system’s CSPRNG: each id is the base64url of 24 bytes it returned (ASVS 3.2.4; express-session uses uid-safe)', async () => {
    world = await makeWorld();
    const drawn: Buffer[] = [];
    const original = crypto.randomBytes.bind(crypto) as (size: number) => Buffer;
    vi.spyOn(crypto, 'randomBytes').mockImplementation(((size: number, callback?: (err: Error | null, buf: Buffer) => void) => {
      const bytes = original(size);
      drawn.push(bytes);
      if (callback) {
        callback(null, bytes);
        return undefined;
      }
      return bytes;
    }) as typeof crypto.randomBytes);
    for (let i = 0; i < 3; i++) {
      drawn.length = 0;
      const id = sessionId(await login(world));
      expect(drawn.filter((b) => b.length === 24).map((b) => b.toString('base64url'))).toContain(id);
    }
  });
});

describe('passwords that are not forced to change', () => {
  it('a password set ten years before is still taken, by the app’s clock; and a person may go back to a password used before (ASVS 2.1.10)', async () => {
    world = await makeWorld({ clock: fixedClock('2036-12-01T03:00:00.000Z') });
    await world.db('users').update({ created_at: '2016-01-01T00:00:00.000Z', updated_at: '2016-01-01T00:00:00.000Z' });
    const reader = await signIn(world.app, 'reader');
    const me = await reader.agent.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe(emails.reader);
    const other = 'quiet meadow under moonlight';
    const changed = await reader.agent.post('/api/auth/password').set('X-CSRF-Token', reader.csrf).send({ currentPassword: PASSWORD, password: other });
    expect(changed.status).toBeLessThan(300);
    const csrf = changed.body.csrfToken ?? (await reader.agent.get('/api/auth/me').expect(200)).body.csrfToken;
    // No history: the password used before is taken again.
    const back = await reader.agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: other, password: PASSWORD });
    expect(back.status, JSON.stringify(back.body)).toBeLessThan(300);
    await signIn(world.app, 'reader');
  });
});

/** Every key of every zod object in a schema, nested ones too. */
function keysOf(schema: unknown, seen = new Set<unknown>()): string[] {
  if (!schema || typeof schema !== 'object' || seen.has(schema)) return [];
  seen.add(schema);
  const keys: string[] = [];
  const shape = (schema as { shape?: unknown }).shape;
  if (shape && typeof shape === 'object') {
    for (const [key, inner] of Object.entries(shape)) keys.push(key, ...keysOf(inner, seen));
  }
  const def = (schema as { _zod?: { def?: Record<string, unknown> } })._zod?.def;
  if (def) for (const inner of Object.values(def)) for (const part of [inner].flat()) keys.push(...keysOf(part, seen));
  return keys;
}

describe('account recovery', () => {
  it('no schema of a request or an account has a password hint or a secret question (ASVS 2.5.2)', async () => {
    const dir = path.resolve('shared/schemas');
    const keys: string[] = [];
    for (const file of fs.readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
      const module = (await import(path.join(dir, file))) as Record<string, unknown>;
      for (const value of Object.values(module)) keys.push(...keysOf(value));
    }
    // The walk reaches the account and password bodies, so an empty answer is not a walk that saw nothing.
    expect(keys).toEqual(expect.arrayContaining(['email', 'password', 'currentPassword', 'name']));
    // A `secret` key is the one-time password key an authenticator app is given at enrolment (second factor, ASVS 2.8), the only one; a secret question or answer would be something else.
    expect(keys.filter((k) => /hint|question|answer|reminder|memorable/i.test(k) || (/secret/i.test(k) && k !== 'secret'))).toEqual([]);
    expect(keys.filter((k) => k === 'secret').length).toBeLessThanOrEqual(1);
  });

  it('never reveals the current password: the reset mail holds a link only, and the database holds a salted hash (ASVS 2.5.3)', async () => {
    world = await makeWorld();
    const asked = await request(world.app).post('/api/auth/password-reset').send({ email: emails.reader });
    expect(asked.status).toBe(202);
    expect(asked.text).not.toContain(PASSWORD);
    const mail = await world.db('mail_outbox').where({ purpose: 'password_reset', to: emails.reader }).first();
    expect(mail.text).toMatch(/\/reset-password#[A-Za-z0-9_-]+/);
    for (const part of [mail.subject, mail.text, mail.html]) expect(part).not.toContain(PASSWORD);
    const user = await world.db('users').where({ email: emails.reader }).first();
    expect(user.password_hash).not.toContain(PASSWORD);
    expect(user.password_hash).toMatch(/^scrypt(-hmac)?\$/);
  });
});
