import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { fixedClock } from '../../server/lib/clock';
import { delayAfter, defaultThrottleRules } from '../../server/modules/auth/login-throttle';
import { movableClock } from '../support/movable-clock';
import { emails, makeWorld, PASSWORD, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const login = (w: World, email: string, password: string, from?: string) => {
  const req = request(w.app).post('/api/auth/login');
  if (from) req.set('X-Forwarded-For', from);
  return req.send({ email, password });
};

// Each failure costs a password hash (about 50 ms): the longest case makes 40 of them.
describe('sign-in throttle', { timeout: 30_000 }, () => {
  it('doubles the delay past five free failures, up to 15 minutes', () => {
    // Worked by hand from the rules in login-throttle.ts.
    expect([4, 5, 6, 7, 14].map((f) => delayAfter(f, 5, defaultThrottleRules))).toEqual([0, 1000, 2000, 4000, 512_000]);
    expect(delayAfter(15, 5, defaultThrottleRules)).toBe(900_000);
    expect(delayAfter(1000, 5, defaultThrottleRules)).toBe(900_000);
  });

  it('slows 40 failures on one account from rotating forwarded addresses, with 429 and Retry-After', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    let failures = 0;
    let waitedS = 0;
    let refused = 0;
    for (let i = 0; failures < 40; i++) {
      const res = await login(world, emails.lead, `guess-number-${i}`, `203.0.113.${i % 250}`);
      if (res.status === 429) {
        refused++;
        expect(res.body.error.code).toBe('rate_limited');
        const retry = Number(res.headers['retry-after']);
        expect(retry).toBeGreaterThan(0);
        waitedS += retry;
        clock.advance(retry * 1000);
      } else {
        expect(res.status).toBe(401);
        failures++;
      }
    }
    // 5 free, then 1 + 2 + … + 512 s (1023 s) and 25 × 900 s: 23,523 s, about 6.5 hours of waiting.
    expect(refused).toBe(35);
    expect(waitedS).toBe(1023 + 25 * 900);
  });

  it('slows one address after 20 failures over many accounts, while another address still signs in', async () => {
    world = await makeWorld();
    for (let i = 0; i < 20; i++) {
      await login(world, `person${i}@test.invalid`, 'a-wrong-password', '198.51.100.7').expect(401);
    }
    const blocked = await login(world, emails.lead, PASSWORD, '198.51.100.7');
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['retry-after'])).toBe(1);
    await login(world, emails.lead, PASSWORD, '198.51.100.8').expect(200);
  });

  it('refuses the correct password during a delay, takes it once the delay has passed, and then starts the account afresh', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    for (let i = 0; i < 5; i++) await login(world, emails.lead, 'a-wrong-password', `192.0.2.${i}`).expect(401);
    const during = await login(world, emails.lead, PASSWORD, '192.0.2.50');
    expect(during.status).toBe(429);
    expect(during.body).toEqual((await login(world, emails.lead, 'a-wrong-password', '192.0.2.51')).body);
    clock.advance(999);
    await login(world, emails.lead, PASSWORD, '192.0.2.52').expect(429);
    clock.advance(1);
    await login(world, emails.lead, PASSWORD, '192.0.2.53').expect(200);
    // The success cleared the account's count: five more failures before any delay.
    for (let i = 0; i < 5; i++) await login(world, emails.lead, 'a-wrong-password', '192.0.2.60').expect(401);
    await login(world, emails.lead, PASSWORD, '192.0.2.61').expect(429);
  });

  it('answers an e-mail no account has exactly as it answers a real account', async () => {
    world = await makeWorld();
    const answers = [];
    for (const [email, from] of [
      [emails.lead, '192.0.2.1'],
      ['nobody@test.invalid', '192.0.2.2'],
    ]) {
      for (let i = 0; i < 5; i++) await login(world, email, 'a-wrong-password', from).expect(401);
      const res = await login(world, email, 'a-wrong-password', from);
      answers.push({ status: res.status, retryAfter: res.headers['retry-after'], body: res.body });
    }
    expect(answers[0].status).toBe(429);
    expect(answers[1]).toEqual(answers[0]);
  });

  it('says how long to wait, in the Retry-After header, the details and the message, alike for an e-mail no account has', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const failThenAsk = async (email: string, from: string) => {
      for (let failures = 0; failures < 11; ) {
        const res = await login(world, email, 'a-wrong-password', from);
        if (res.status === 429) clock.advance(Number(res.headers['retry-after']) * 1000);
        else failures++;
      }
      return login(world, email, PASSWORD, from);
    };
    // By the rules in login-throttle.ts: the 11th failure is the 7th from the fifth, 1 s · 2^6 = 64 s, which rounds up to 2 minutes.
    const known = await failThenAsk(emails.lead, '192.0.2.1');
    expect(known.status).toBe(429);
    expect(known.headers['retry-after']).toBe('64');
    expect(known.body.error).toEqual({ code: 'rate_limited', message: 'Too many failed sign-ins. Try again in 2 minutes.', details: { retryAfterSeconds: 64 } });
    const unknown = await failThenAsk('nobody@test.invalid', '192.0.2.2');
    expect(unknown.headers['retry-after']).toBe(known.headers['retry-after']);
    expect(unknown.body).toEqual(known.body);
  });

  it('forgets an address after an hour without failures, and an account after a day', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    for (let i = 0; i < 20; i++) await login(world, `person${i}@test.invalid`, 'a-wrong-password', '198.51.100.7').expect(401);
    for (let i = 0; i < 5; i++) await login(world, emails.lead, 'a-wrong-password', `192.0.2.${i}`).expect(401);
    clock.advance(3600 * 1000 + 1);
    // The address starts afresh (this failure is its first); the account does not.
    await login(world, 'person99@test.invalid', 'a-wrong-password', '198.51.100.7').expect(401);
    await login(world, emails.lead, 'a-wrong-password', '192.0.2.70').expect(401);
    clock.advance(1999); // the sixth failure earned 2 s
    await login(world, emails.lead, 'a-wrong-password', '192.0.2.71').expect(429);
    clock.advance(24 * 3600 * 1000);
    await login(world, emails.lead, PASSWORD, '192.0.2.72').expect(200);
  });

  it('ignores X-Forwarded-For from a peer TRUST_PROXY does not name', async () => {
    world = await makeWorld({ trustProxy: false });
    for (let i = 0; i < 20; i++) {
      await login(world, `person${i}@test.invalid`, 'a-wrong-password', `203.0.113.${i}`).expect(401);
    }
    // Every request came from this test's own address, whatever the header said.
    await login(world, emails.lead, PASSWORD, '203.0.113.200').expect(429);
  });

  it('counts a burst of simultaneous failures, each one, without an error', async () => {
    world = await makeWorld();
    const burst = await Promise.all(Array.from({ length: 12 }, (_, i) => login(world, emails.lead, `burst-${i}`, `192.0.2.${100 + i}`)));
    expect(burst.every((r) => r.status === 401 || r.status === 429)).toBe(true);
    const row = await world.db('login_throttle').where({ key: `account:${emails.lead}` }).first();
    expect(row.failures).toBe(burst.filter((r) => r.status === 401).length);
    await login(world, emails.lead, PASSWORD, '192.0.2.99').expect(429);
  });

  it('keeps its counts in the database, so another process on it sees them', async () => {
    world = await makeWorld();
    for (let i = 0; i < 5; i++) await login(world, emails.lead, 'a-wrong-password', '192.0.2.9').expect(401);
    const second = createApp({ db: world.db, clock: fixedClock('2026-12-01T03:00:00.000Z'), sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0 });
    const res = await request(second).post('/api/auth/login').set('X-Forwarded-For', '192.0.2.10').send({ email: emails.lead, password: PASSWORD });
    expect(res.status).toBe(429);
  });
});
