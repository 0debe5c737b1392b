import { afterEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { RESET_ANSWER_FLOOR_MS } from '../../server/modules/password-resets/password-resets.service';
import { movableClock } from '../support/movable-clock';
import { emails, makeWorld, openLink, PASSWORD, signIn, type World } from '../support/world';

const worlds: World[] = [];
afterEach(async () => {
  await Promise.all(worlds.splice(0).map((w) => w.db.destroy()));
});

async function world(options: Parameters<typeof makeWorld>[0] = {}): Promise<World> {
  const w = await makeWorld(options);
  worlds.push(w);
  return w;
}

async function requestReset(w: World, email: string, from?: string) {
  const started = performance.now();
  const req = request(w.app).post('/api/auth/password-reset');
  if (from) req.set('X-Forwarded-For', from);
  const res = await req.send({ email });
  return { res, ms: performance.now() - started };
}

async function queuedToken(w: World, to: string): Promise<string> {
  const mail = await w.db('mail_outbox').where({ purpose: 'password_reset', to }).orderBy('id', 'desc').first();
  const m = /\/reset-password#([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!m) throw new Error(`no reset link in: ${mail.text}`);
  expect(mail.html).toContain(`/reset-password#${m[1]}`);
  return m[1];
}

const resetMails = async (w: World, to?: string) =>
  Number((await w.db('mail_outbox').where({ purpose: 'password_reset', ...(to ? { to } : {}) }).count('* as n').first())?.n);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

describe('asking for a password reset', () => {
  it('answers with the same status and body whether or not an account has the address, and queues mail only for the account', async () => {
    const w = await world();
    const known = await requestReset(w, emails.reader);
    const unknown = await requestReset(w, 'nobody@test.invalid');
    expect(known.res.status).toBe(202);
    expect(unknown.res.status).toBe(202);
    expect(unknown.res.body).toEqual(known.res.body);
    expect(unknown.res.text).toBe(known.res.text);
    const queued = await w.db('mail_outbox').where({ purpose: 'password_reset' });
    expect(queued.map((m: { to: string }) => m.to)).toEqual([emails.reader]);
    const token = await queuedToken(w, emails.reader);
    const row = await w.db('password_resets').first();
    expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    // One hour after the world's clock (2026-12-01T03:00Z)
    expect(row.expires_at).toBe('2026-12-01T04:00:00.000Z');
  });

  it('takes the same time either way: medians of interleaved tries within 40 ms, none sooner than the floor', async () => {
    const w = await world();
    const knownMs: number[] = [];
    const unknownMs: number[] = [];
    // Different known accounts, so that the cap of three links an hour per account never applies.
    const accounts = [emails.reader, emails.observer, emails.pi, emails.lead, emails.outsider];
    for (const [i, email] of accounts.entries()) {
      knownMs.push((await requestReset(w, email)).ms);
      unknownMs.push((await requestReset(w, `nobody-${i}@test.invalid`)).ms);
    }
    expect(await w.db('mail_outbox').where({ purpose: 'password_reset' }).count('* as n').first()).toEqual({ n: accounts.length });
    for (const ms of [...knownMs, ...unknownMs]) expect(ms).toBeGreaterThanOrEqual(RESET_ANSWER_FLOOR_MS - 1);
    // Loose bound: the floor hides a write of a few milliseconds; 40 ms allows for a busy test machine.
    expect(Math.abs(median(knownMs) - median(unknownMs))).toBeLessThan(40);
  });
});

// Limits from resetLimits in password-resets.service.ts: three links an hour per account, twenty requests an hour per address.
describe('a hostile requester of reset links', { timeout: 30_000 }, () => {
  it('gets three links an hour for one account however it varies its address or the case of the e-mail, then nothing, answered alike', async () => {
    const clock = movableClock();
    const w = await world({ clock });
    const typed = [emails.pi, emails.pi.toUpperCase(), ` ${emails.pi}`, emails.pi, emails.pi];
    const answers = [];
    for (const [i, email] of typed.entries()) answers.push((await requestReset(w, email, `203.0.113.${i}`)).res);
    expect(answers.map((a) => a.status)).toEqual([202, 202, 202, 202, 202]);
    expect(new Set(answers.map((a) => a.text)).size).toBe(1);
    expect(await resetMails(w, emails.pi)).toBe(3);
    clock.advance(3600 * 1000 + 1);
    await requestReset(w, emails.pi, '203.0.113.99');
    expect(await resetMails(w, emails.pi)).toBe(4);
  });

  it('is answered exactly alike for an account and for an e-mail no account has, past the account limit too', async () => {
    const w = await world();
    const answers: string[] = [];
    for (const email of [emails.reader, 'nobody@test.invalid']) {
      for (let i = 0; i < 4; i++) {
        const { res } = await requestReset(w, email, `198.51.100.${i}`);
        answers.push(JSON.stringify({ status: res.status, retryAfter: res.headers['retry-after'], type: res.headers['content-type'], body: res.body }));
      }
    }
    expect(new Set(answers).size).toBe(1);
    expect(JSON.parse(answers[0]).status).toBe(202);
    expect(await resetMails(w)).toBe(3);
  });

  it('may ask twenty times from one address over many e-mails; the next is refused with 429 and the wait, whatever the e-mail, while another address still asks', async () => {
    const clock = movableClock();
    const w = await world({ clock });
    const accounts = [emails.reader, emails.observer, emails.pi, emails.lead, emails.outsider];
    for (let i = 0; i < 20; i++) {
      await requestReset(w, i < accounts.length ? accounts[i] : `person${i}@test.invalid`, '192.0.2.7').then(({ res }) => expect(res.status).toBe(202));
    }
    expect(await resetMails(w)).toBe(accounts.length);
    const refused = [];
    for (const email of [emails.admin, 'nobody@test.invalid']) refused.push((await requestReset(w, email, '192.0.2.7')).res);
    for (const res of refused) {
      expect(res.status).toBe(429);
      expect(res.headers['retry-after']).toBe('3600');
      expect(res.body.error).toEqual({ code: 'rate_limited', message: 'Too many requests for a reset link from this address. Try again in 1 hour.', details: { retryAfterSeconds: 3600 } });
    }
    expect(refused[1].text).toBe(refused[0].text);
    expect(await resetMails(w, emails.admin)).toBe(0);
    await requestReset(w, emails.admin, '192.0.2.8').then(({ res }) => expect(res.status).toBe(202));
    expect(await resetMails(w, emails.admin)).toBe(1);
    clock.advance(3600 * 1000 + 1);
    await requestReset(w, 'person99@test.invalid', '192.0.2.7').then(({ res }) => expect(res.status).toBe(202));
  });

  it('cannot escape the address limit by forging X-Forwarded-For when TRUST_PROXY does not name the peer', async () => {
    const w = await world({ trustProxy: false });
    for (let i = 0; i < 20; i++) await requestReset(w, `person${i}@test.invalid`, `203.0.113.${i}`).then(({ res }) => expect(res.status).toBe(202));
    expect((await requestReset(w, emails.reader, '203.0.113.200')).res.status).toBe(429);
    expect(await resetMails(w)).toBe(0);
  });

  it('is counted in the login_throttle table beside the sign-in counts, under its own keys', async () => {
    const w = await world();
    await requestReset(w, emails.reader, '192.0.2.30');
    const keys = (await w.db('login_throttle').select('key', 'failures')).map((r: { key: string; failures: number }) => `${r.key}=${r.failures}`).sort();
    expect(keys).toEqual([`reset-account:${emails.reader}`, 'reset-address:192.0.2.30'].map((k) => `${k}=1`).sort());
  });
});

describe('setting a new password from the link', () => {
  it('sets it, ends every session of the account, and refuses the link a second time', async () => {
    const w = await world();
    const phone = await signIn(w.app, 'reader');
    const desk = await signIn(w.app, 'reader');
    const other = await signIn(w.app, 'observer');
    await requestReset(w, emails.reader);
    const token = await queuedToken(w, emails.reader);

    const looked = await request(w.app).post('/api/auth/password-reset/lookup').send({ token }).expect(200);
    expect(looked.body.reset).toEqual({ email: emails.reader, expiresAt: '2026-12-01T04:00:00.000Z' });

    const done = await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'a-brand-new-password' });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    await phone.agent.get('/api/auth/me').expect(401);
    await desk.agent.get('/api/auth/me').expect(401);
    // Another account's session is untouched.
    await other.agent.get('/api/auth/me').expect(200);

    await request(w.app).post('/api/auth/login').send({ email: emails.reader, password: 'a-brand-new-password' }).expect(200);
    await request(w.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(401);

    const reused = await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'yet-another-password' });
    expect(reused.status).toBe(410);
    expect(reused.body.error.code).toBe('link_used');
    expect(reused.body.error.message).toMatch(/already been used/);
    await request(w.app).post('/api/auth/login').send({ email: emails.reader, password: 'a-brand-new-password' }).expect(200);

    const trail = await w.db('trail_events').where({ action: 'user.password_reset' });
    expect(trail).toHaveLength(1);
    expect(trail[0].entity_id).toBe(w.userIds.reader);
    expect(JSON.parse(trail[0].after_json)).toEqual({ sessionsEnded: 2 });
  });

  it('refuses a session of the old password even when a request in flight writes it back to the store', async () => {
    const w = await world();
    const old = await signIn(w.app, 'reader');
    const saved = await w.db('sessions').select('*');
    expect(saved).toHaveLength(1);
    const token = await openLink(w, 'reset', { email: emails.reader });
    await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'a-brand-new-password' }).expect(200);
    expect(await w.db('sessions').count('* as n').first()).toEqual({ n: 0 });
    await w.db('sessions').insert(saved);
    const res = await old.agent.get('/api/auth/me');
    expect(res.status).toBe(401);
    // A session opened with the new password is accepted.
    const fresh = request.agent(w.app);
    await fresh.post('/api/auth/login').send({ email: emails.reader, password: 'a-brand-new-password' }).expect(200);
    await fresh.get('/api/auth/me').expect(200);
  });

  it('closes the account’s other open links once a password is set', async () => {
    const w = await world();
    const first = await openLink(w, 'reset');
    const second = await openLink(w, 'reset');
    await request(w.app).post('/api/auth/password-reset/complete').send({ token: second, password: 'a-brand-new-password' }).expect(200);
    const res = await request(w.app).post('/api/auth/password-reset/complete').send({ token: first, password: 'another-new-password' });
    expect(res.body.error.code).toBe('link_used');
  });

  it('refuses an expired link with its own message and keeps the old password', async () => {
    const w = await world();
    const token = await openLink(w, 'reset', { email: emails.reader, expiresAt: '2026-12-01T02:59:00.000Z' });
    for (const path of ['/api/auth/password-reset/lookup', '/api/auth/password-reset/complete']) {
      const res = await request(w.app).post(path).send({ token, password: 'a-brand-new-password' });
      expect(res.status).toBe(410);
      expect(res.body.error.code).toBe('link_expired');
      expect(res.body.error.message).toMatch(/expired/);
    }
    await request(w.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
  });

  it('holds a too-short password to the account rules, naming the field, and leaves the link usable', async () => {
    const w = await world();
    const token = await openLink(w, 'reset');
    const res = await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'password', message: 'Use at least 12 characters; a few words together make a good password.' }]);
    await request(w.app).post('/api/auth/password-reset/lookup').send({ token }).expect(200);
  });

  it('ends the session of the browser that sets the password when it is the account’s own', async () => {
    const w = await world();
    const own = await signIn(w.app, 'outsider');
    const token = await openLink(w, 'reset');
    await own.agent.post('/api/auth/password-reset/complete').set('X-CSRF-Token', own.csrf).send({ token, password: 'a-brand-new-password' }).expect(200);
    await own.agent.get('/api/auth/me').expect(401);
  });
});
