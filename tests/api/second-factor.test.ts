import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { Secret } from 'otpauth';
import { createApp } from '../../server/app';
import { totpFor } from '../../server/modules/second-factor/second-factor.service';
import { movableClock } from '../support/movable-clock';
import { codeAt, enrolSecondFactor } from '../support/second-factor';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

let world: World | undefined;
afterEach(async () => {
  await world?.db.destroy();
  world = undefined;
});

const detail = (res: request.Response, field: string) => (res.body.error?.details as { path: string; message: string }[] | undefined)?.find((d) => d.path === field)?.message;

async function enrol(w: World, who: Parameters<typeof signIn>[1], clock: ReturnType<typeof movableClock>) {
  const s = await signIn(w.app, who);
  return { ...s, ...(await enrolSecondFactor(s, clock.now())) };
}

describe('one-time codes (RFC 6238)', () => {
  // RFC 6238 Appendix B, the SHA-1 rows: seed "12345678901234567890" (ASCII), 8 digits, 30-second steps.
  // A 6-digit code is the same HOTP value taken mod 10^6 (RFC 4226 §5.3), so it is the vector's last six digits.
  const rfc6238 = [
    [59, '94287082'],
    [1111111109, '07081804'],
    [1111111111, '14050471'],
    [1234567890, '89005924'],
    [2000000000, '69279037'],
    [20000000000, '65353130'],
  ] as const;
  const seed = Secret.fromUTF8('12345678901234567890').base32;

  it('the server’s codes are RFC 6238 Appendix B’s SHA-1 test vectors (their last six digits)', () => {
    for (const [seconds, eight] of rfc6238) {
      expect(totpFor(seed, 'rfc6238@test.invalid').generate({ timestamp: seconds * 1000 }), `T=${seconds}`).toBe(eight.slice(2));
    }
  });
});

describe('the second factor', () => {
  it('is enrolled with a QR code and its secret as text, turned on by a current code with the password, and gives ten single-use recovery codes kept only hashed', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const s = await signIn(world.app, 'reader');
    expect((await s.agent.get('/api/auth/second-factor').expect(200)).body).toEqual({ on: false, recoveryCodesLeft: 0 });
    const setup = await s.agent.post('/api/auth/second-factor/setup').set('X-CSRF-Token', s.csrf).expect(200);
    expect(setup.body.secret).toMatch(/^[A-Z2-7]{32}$/);
    expect(setup.body.qrCode).toMatch(/^data:image\/svg\+xml;base64,/);
    expect(Buffer.from(setup.body.qrCode.split(',')[1], 'base64').toString()).toContain('<svg');
    // Key URI format (github.com/google/google-authenticator/wiki/Key-Uri-Format): otpauth://totp/ISSUER:LABEL?secret=…&issuer=…
    expect(setup.body.uri).toMatch(new RegExp(`^otpauth://totp/Starledger:reader%40test\\.invalid\\?.*secret=${setup.body.secret}`));

    const confirm = (body: object) => s.agent.post('/api/auth/second-factor/confirm').set('X-CSRF-Token', s.csrf).send(body);
    const wrong = await confirm({ currentPassword: PASSWORD, code: '000000' === codeAt(setup.body.secret, clock.now()) ? '111111' : '000000' }).expect(400);
    expect(detail(wrong, 'code')).toMatch(/not the current code/);
    // The session alone does not put a device on the account: the password comes with the first code.
    expect(detail(await confirm({ code: codeAt(setup.body.secret, clock.now()) }).expect(400), 'currentPassword')).toMatch(/Confirm with your current password/);
    expect(detail(await confirm({ currentPassword: 'not-the-password', code: codeAt(setup.body.secret, clock.now()) }).expect(400), 'currentPassword')).toMatch(/not your current password/);
    expect((await s.agent.get('/api/auth/me').expect(200)).body.user.secondFactor).toBe(false);

    const ok = await confirm({ currentPassword: PASSWORD, code: codeAt(setup.body.secret, clock.now()) }).expect(200);
    const codes = ok.body.recoveryCodes as string[];
    expect(codes).toHaveLength(10);
    expect(new Set(codes).size).toBe(10);
    expect((await s.agent.get('/api/auth/second-factor').expect(200)).body).toEqual({ on: true, recoveryCodesLeft: 10 });
    // Stored: the secret encrypted, the recovery codes as hashes.
    const row = await world.db('users').where({ id: world.userIds.reader }).first();
    expect(row.totp_secret).toMatch(/^v1\./);
    expect(row.totp_secret).not.toContain(setup.body.secret);
    const stored = JSON.stringify(await world.db('recovery_codes').select('*'));
    for (const c of codes) expect(stored).not.toContain(c.replace('-', ''));
    // Ten codes of 10 symbols from 31 carry about 50 bits each, under ASVS 2.6.2's 112, so each is hashed with its own random 32-bit salt.
    const rows: { salt: string; code_hash: string }[] = await world.db('recovery_codes').select('salt', 'code_hash');
    expect(rows.every((r) => /^[0-9a-f]{8}$/.test(r.salt))).toBe(true);
    expect(new Set(rows.map((r) => r.salt)).size).toBe(10);
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.code_hash))).toBe(true);
  });

  it('after a correct password the session is not signed in until a code; a code is taken once, a recovery code once, and wrong codes are throttled', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock, loginThrottle: { accountFreeFailures: 3 } });
    const { secret, recoveryCodes } = await enrol(world, 'reader', clock);

    const agent = request.agent(world.app);
    const first = await agent.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    expect(first.body).toMatchObject({ secondFactorRequired: true });
    expect(first.body.csrfToken).toBeUndefined();
    await agent.get('/api/auth/me').expect(401);
    await agent.get('/api/projects').expect(401);
    // The code enrolment took is of this same 30-second step: it is not taken twice (ASVS 2.8.4).
    const replay = await agent.post('/api/auth/login/code').send({ code: codeAt(secret, clock.now()) }).expect(400);
    expect(detail(replay, 'code')).toMatch(/used already/);
    clock.advance(30_000);
    const code = codeAt(secret, clock.now());
    const signedIn = await agent.post('/api/auth/login/code').send({ code }).expect(200);
    expect(signedIn.body.user.email).toBe(emails.reader);
    await agent.get('/api/auth/me').expect(200);

    // The same code from another browser within its window: refused.
    const other = request.agent(world.app);
    await other.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    expect(detail(await other.post('/api/auth/login/code').send({ code }).expect(400), 'code')).toMatch(/used already/);
    // A recovery code signs in once (typed in lower case and without its dash, too).
    const recovery = recoveryCodes[0]!;
    await other.post('/api/auth/login/code').send({ code: recovery.toLowerCase().replace('-', '') }).expect(200);
    const third = request.agent(world.app);
    await third.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    await third.post('/api/auth/login/code').send({ code: recovery }).expect(400);

    // The code step without a password first: 401.
    await request(world.app).post('/api/auth/login/code').send({ code: '123456' }).expect(401);

    // Wrong codes count against the account like wrong passwords: the recovery code refused just now was one, two more
    // reach the three free ones, and the next attempt waits (429 with Retry-After) before its code is looked at.
    const guesser = request.agent(world.app);
    await guesser.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const statuses: number[] = [];
    for (let i = 0; i < 2; i++) statuses.push((await guesser.post('/api/auth/login/code').send({ code: 'WRONG-CODE' })).status);
    expect(statuses).toEqual([400, 400]);
    const limited = await guesser.post('/api/auth/login/code').send({ code: codeAt(secret, clock.now()) });
    expect(limited.status).toBe(429);
    expect(limited.headers['retry-after']).toBeDefined();
  });

  it('under another SECOND_FACTOR_KEY answers 503 naming the key, not 500, and signs nobody in; under its own key the same code still works', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const { secret } = await enrol(world, 'reader', clock);
    clock.advance(30_000);
    // A second process on the same database, started with a key other than the one the secret was sealed under.
    const otherKey = createApp({ db: world.db, clock, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, secondFactorKey: 'a-different-key', adminSecondFactor: 'optional' });
    const agent = request.agent(otherKey);
    await agent.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const refused = await agent.post('/api/auth/login/code').send({ code: codeAt(secret, clock.now()) });
    expect(refused.status).toBe(503);
    expect(refused.body.error.code).toBe('second_factor_key_mismatch');
    expect(refused.body.error.message).toMatch(/SECOND_FACTOR_KEY/);
    await agent.get('/api/auth/me').expect(401);
    const own = request.agent(world.app);
    await own.post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    await own.post('/api/auth/login/code').send({ code: codeAt(secret, clock.now()) }).expect(200);
  });

  it('takes a code of the 30-second step before or after the server’s (a device clock a little off) and refuses one two steps away', async () => {
    // RFC 6238 §5.2 recommends allowing at most one time step of delay; the same window is taken ahead of the server.
    const clock = movableClock();
    world = await makeWorld({ clock });
    const s = await enrol(world, 'reader', clock);
    const make = (at: number) => s.agent.post('/api/tokens').set('X-CSRF-Token', s.csrf).send({ name: 'night pipeline', code: codeAt(s.secret, new Date(clock.now().getTime() + at)) });
    clock.advance(90_000);
    expect(detail(await make(-60_000).expect(400), 'code')).toMatch(/not a current code/);
    expect(detail(await make(60_000).expect(400), 'code')).toMatch(/not a current code/);
    await make(-30_000).expect(201);
    clock.advance(60_000);
    await make(30_000).expect(201);
  });

  it('is turned off only with the password and a code, each named when missing or wrong', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const s = await enrol(world, 'observer', clock);
    clock.advance(30_000);
    const off = (body: object) => s.agent.post('/api/auth/second-factor/off').set('X-CSRF-Token', s.csrf).send(body);
    const none = await off({}).expect(400);
    expect(detail(none, 'currentPassword')).toMatch(/current password/);
    expect(detail(none, 'code')).toMatch(/authenticator/);
    expect(detail(await off({ currentPassword: 'not-the-password', code: codeAt(s.secret, clock.now()) }).expect(400), 'currentPassword')).toMatch(/not your current password/);
    expect(detail(await off({ currentPassword: PASSWORD, code: '000001' === codeAt(s.secret, clock.now()) ? '000002' : '000001' }).expect(400), 'code')).toMatch(/not a current code/);
    await off({ currentPassword: PASSWORD, code: codeAt(s.secret, clock.now()) }).expect(200);
    expect((await s.agent.get('/api/auth/second-factor').expect(200)).body).toEqual({ on: false, recoveryCodesLeft: 0 });
    expect(await world.db('recovery_codes').count({ n: '*' }).first()).toMatchObject({ n: 0 });
    // Sign-in is a password only again.
    await signIn(world.app, 'observer');
  });
});

describe('site-admin routes with ADMIN_SECOND_FACTOR required (ASVS 4.3.1)', () => {
  const adminRoutes = [
    ['get', '/api/users'],
    ['get', '/api/admin/mail'],
    ['post', '/api/projects'],
  ] as const;

  it('refuse a site admin without a second factor with 403 saying to turn it on under Account, and let one in whose session passed it', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock, adminSecondFactor: 'required' });
    const s = await signIn(world.app, 'admin');
    for (const [method, path] of adminRoutes) {
      const res = await s.agent[method](path).set('X-CSRF-Token', s.csrf).send({});
      expect(res.status, path).toBe(403);
      expect(res.body.error.code).toBe('second_factor_required');
      expect(res.body.error.message).toMatch(/Turn it on under Account/);
    }
    // An API token of the site admin is one factor: refused too, before and after enrolment.
    const token = (await s.agent.post('/api/tokens').set('X-CSRF-Token', s.csrf).send({ name: 'admin script', currentPassword: PASSWORD }).expect(201)).body.token as string;
    const { secret } = await enrolSecondFactor(s, clock.now());
    // The session that enrolled has shown a code: in.
    await s.agent.get('/api/users').expect(200);
    expect((await request(world.app).get('/api/users').set('Authorization', `Bearer ${token}`).expect(403)).body.error.code).toBe('second_factor_required');
    // A fresh sign-in: in after its code step.
    clock.advance(30_000);
    const fresh = request.agent(world.app);
    await fresh.post('/api/auth/login').send({ email: emails.admin, password: PASSWORD }).expect(200);
    await fresh.get('/api/users').expect(401);
    await fresh.post('/api/auth/login/code').send({ code: codeAt(secret, clock.now()) }).expect(200);
    await fresh.get('/api/users').expect(200);
    // Other people are refused as before, with the plain 403.
    const reader = await signIn(world.app, 'reader');
    expect((await reader.agent.get('/api/users').expect(403)).body.error.code).toBe('forbidden');
  });
});

describe('sensitive changes carry the password or a code in the same request (ASVS 3.7.1, 4.3.3)', () => {
  it('a new API token: refused without the current password or with a wrong one (naming currentPassword), made with it, or with a code once the second factor is on', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const s = await signIn(world.app, 'lead');
    const make = (body: object) => s.agent.post('/api/tokens').set('X-CSRF-Token', s.csrf).send({ name: 'night pipeline', ...body });
    expect(detail(await make({}).expect(400), 'currentPassword')).toMatch(/Confirm with your current password/);
    expect(detail(await make({ currentPassword: 'not-the-password' }).expect(400), 'currentPassword')).toMatch(/not your current password/);
    await make({ currentPassword: PASSWORD }).expect(201);
    expect(await world.db('api_tokens').count({ n: '*' }).first()).toMatchObject({ n: 1 });

    const enrolled = await enrol(world, 'lead', clock);
    clock.advance(30_000);
    const code = codeAt(enrolled.secret, clock.now());
    await make({ code }).expect(201);
    expect(detail(await make({ code }).expect(400), 'code')).toMatch(/used already/);
    expect(detail(await make({}).expect(400), 'currentPassword')).toMatch(/password or a code/);
  });

  it('a new account made by the site admin: refused without the admin’s own password (naming currentPassword), nothing made', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'admin');
    const make = (body: object) => s.agent.post('/api/users').set('X-CSRF-Token', s.csrf).send({ email: 'corvin.ash@test.invalid', name: 'Corvin Ash', password: 'a long password of words', ...body });
    expect(detail(await make({}).expect(400), 'currentPassword')).toMatch(/current password/);
    expect(detail(await make({ currentPassword: 'a-guess-at-it' }).expect(400), 'currentPassword')).toMatch(/not your current password/);
    expect(await world.db('users').where({ email: 'corvin.ash@test.invalid' }).first()).toBeUndefined();
    await make({ currentPassword: PASSWORD }).expect(201);
  });
});
