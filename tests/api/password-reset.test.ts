import { afterEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { RESET_ANSWER_FLOOR_MS } from '../../server/modules/password-resets/password-resets.service';
import { emails, makeWorld, openLink, PASSWORD, signIn, type World } from '../support/world';

const worlds: World[] = [];
afterEach(async () => {
  await Promise.all(worlds.splice(0).map((w) => w.db.destroy()));
});

async function world(): Promise<World> {
  const w = await makeWorld();
  worlds.push(w);
  return w;
}

async function requestReset(w: World, email: string) {
  const started = performance.now();
  const res = await request(w.app).post('/api/auth/password-reset').send({ email });
  return { res, ms: performance.now() - started };
}

async function queuedToken(w: World, to: string): Promise<string> {
  const mail = await w.db('mail_outbox').where({ purpose: 'password_reset', to }).orderBy('id', 'desc').first();
  const m = /\/reset-password#([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!m) throw new Error(`no reset link in: ${mail.text}`);
  expect(mail.html).toContain(`/reset-password#${m[1]}`);
  return m[1];
}

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

  it('sends at most three links an hour to one account, answering the fourth request the same', async () => {
    const w = await world();
    const answers = [];
    for (let i = 0; i < 4; i++) answers.push((await requestReset(w, emails.pi)).res);
    expect(new Set(answers.map((a) => `${a.status} ${a.text}`)).size).toBe(1);
    expect(await w.db('mail_outbox').where({ purpose: 'password_reset' }).count('* as n').first()).toEqual({ n: 3 });
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
