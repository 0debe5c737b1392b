import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { emails, makeWorld, PASSWORD, signIn, type Session, type Who, type World } from '../support/world';
import { movableClock } from '../support/movable-clock';
import { browserSummary } from '../../server/modules/auth/sessions.service';

let world: World;
afterEach(async () => world?.db.destroy());

// User-agent strings as MDN's "User-Agent" header reference gives them for Firefox on Linux and Chrome on Windows.
const FIREFOX_LINUX = 'Mozilla/5.0 (X11; Linux x86_64; rv:133.0) Gecko/20100101 Firefox/133.0';
const CHROME_WINDOWS = 'Mozilla/5.0 (Windows NT 10.0; Win64; x64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0.0.0 Safari/537.36';
// Addresses from the blocks RFC 5737 sets aside for documentation.
const ADDRESS_A = '203.0.113.7';
const ADDRESS_B = '198.51.100.20';

/** Signs in from a browser with this user agent and (through the trusted loopback proxy) this address. */
async function signInFrom(who: Who, userAgent: string, address: string): Promise<Session> {
  const agent = request.agent(world.app);
  const res = await agent.post('/api/auth/login').set('User-Agent', userAgent).set('X-Forwarded-For', address).send({ email: emails[who], password: PASSWORD }).expect(200);
  return { agent, csrf: res.body.csrfToken };
}

// OWASP ASVS 4.0.3 3.3.4: "Verify that users are able to view and (having re-entered login credentials) log out of any or all currently active sessions and devices."
describe('a person’s own sessions (ASVS 3.3.4)', () => {
  it('lists each session with when it began, its last use, its browser and address, and marks this one; never the session’s secret', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const laptop = await signInFrom('observer', FIREFOX_LINUX, ADDRESS_A);
    clock.advance(5 * 60_000);
    await signInFrom('observer', CHROME_WINDOWS, ADDRESS_B);
    await signInFrom('reader', CHROME_WINDOWS, ADDRESS_B);
    clock.advance(2 * 60_000);

    const res = await laptop.agent.get('/api/auth/sessions').expect(200);
    expect(res.body.sessions).toEqual([
      { id: expect.any(String), signedInAt: '2026-12-01T03:00:00.000Z', lastSeenAt: '2026-12-01T03:07:00.000Z', browser: 'Firefox 133 on Linux', userAgent: FIREFOX_LINUX, address: ADDRESS_A, current: true },
      { id: expect.any(String), signedInAt: '2026-12-01T03:05:00.000Z', lastSeenAt: '2026-12-01T03:05:00.000Z', browser: 'Chrome 131 on Windows', userAgent: CHROME_WINDOWS, address: ADDRESS_B, current: false },
    ]);
    // How long any session lasts, for the page to say: the defaults, ASVS 3.3.2's level-2 bounds.
    expect(res.body.limits).toEqual({ maxHours: 12, idleMinutes: 30 });
    const sids: string[] = (await world.db('sessions').select('sid')).map((r) => r.sid);
    const listed = JSON.stringify(res.body);
    // The cookie carries the sid (signed); the list names sessions by a hash of it instead.
    expect(sids).toHaveLength(3);
    for (const sid of sids) expect(listed).not.toContain(sid);
  });

  it('ends another of my sessions, which is then refused, while this one goes on', async () => {
    world = await makeWorld();
    const here = await signIn(world.app, 'lead');
    const there = await signInFrom('lead', CHROME_WINDOWS, ADDRESS_B);
    const other = (await here.agent.get('/api/auth/sessions').expect(200)).body.sessions.find((s: { current: boolean }) => !s.current);
    await here.agent.delete(`/api/auth/sessions/${other.id}`).set('X-CSRF-Token', here.csrf).send({ currentPassword: PASSWORD }).expect(204);
    await there.agent.get('/api/auth/me').expect(401);
    await here.agent.get('/api/auth/me').expect(200);
    expect((await here.agent.get('/api/auth/sessions').expect(200)).body.sessions).toHaveLength(1);
  });

  it('ending this session signs this browser out', async () => {
    world = await makeWorld();
    const here = await signIn(world.app, 'reader');
    const [mine] = (await here.agent.get('/api/auth/sessions').expect(200)).body.sessions;
    await here.agent.delete(`/api/auth/sessions/${mine.id}`).set('X-CSRF-Token', here.csrf).send({ currentPassword: PASSWORD }).expect(204);
    await here.agent.get('/api/auth/me').expect(401);
  });

  it('ends all my other sessions at once, and no one else’s', async () => {
    world = await makeWorld();
    const here = await signIn(world.app, 'pi');
    const others = [await signIn(world.app, 'pi'), await signInFrom('pi', FIREFOX_LINUX, ADDRESS_A), await signInFrom('pi', CHROME_WINDOWS, ADDRESS_B)];
    const someoneElse = await signIn(world.app, 'observer');
    expect((await here.agent.post('/api/auth/sessions/end-others').set('X-CSRF-Token', here.csrf).send({ currentPassword: PASSWORD }).expect(200)).body).toEqual({ ended: 3 });
    for (const o of others) await o.agent.get('/api/auth/me').expect(401);
    await here.agent.get('/api/auth/me').expect(200);
    await someoneElse.agent.get('/api/auth/me').expect(200);
  });

  it('cannot see or end another person’s session: its id is not found among mine', async () => {
    world = await makeWorld();
    const mine = await signIn(world.app, 'reader');
    const theirs = await signIn(world.app, 'lead');
    const [their] = (await theirs.agent.get('/api/auth/sessions').expect(200)).body.sessions;
    expect((await mine.agent.get('/api/auth/sessions').expect(200)).body.sessions.map((s: { id: string }) => s.id)).not.toContain(their.id);
    const res = await mine.agent.delete(`/api/auth/sessions/${their.id}`).set('X-CSRF-Token', mine.csrf).send({ currentPassword: PASSWORD }).expect(404);
    expect(res.body.error.message).toBe('No such session of yours; it may have ended already.');
    await theirs.agent.get('/api/auth/me').expect(200);
  });

  it('does not list a session past its idle limit', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    await signIn(world.app, 'observer');
    clock.advance(40 * 60_000);
    const now = await signIn(world.app, 'observer');
    expect((await now.agent.get('/api/auth/sessions').expect(200)).body.sessions).toHaveLength(1);
  });

  it('ending one session or all the others asks for the password again (or a code), naming the field, and ends nothing without it', async () => {
    world = await makeWorld();
    const here = await signIn(world.app, 'lead');
    const there = await signInFrom('lead', CHROME_WINDOWS, ADDRESS_B);
    const other = (await here.agent.get('/api/auth/sessions').expect(200)).body.sessions.find((s: { current: boolean }) => !s.current);
    const detail = (res: request.Response) => (res.body.error.details as { path: string; message: string }[]).find((d) => d.path === 'currentPassword')?.message;
    expect(detail(await here.agent.delete(`/api/auth/sessions/${other.id}`).set('X-CSRF-Token', here.csrf).expect(400))).toMatch(/Confirm with your current password/);
    expect(detail(await here.agent.delete(`/api/auth/sessions/${other.id}`).set('X-CSRF-Token', here.csrf).send({ currentPassword: 'not-the-password' }).expect(400))).toMatch(/not your current password/);
    expect(detail(await here.agent.post('/api/auth/sessions/end-others').set('X-CSRF-Token', here.csrf).send({}).expect(400))).toMatch(/Confirm with your current password/);
    await there.agent.get('/api/auth/me').expect(200);
    await here.agent.post('/api/auth/sessions/end-others').set('X-CSRF-Token', here.csrf).send({ currentPassword: PASSWORD }).expect(200);
    await there.agent.get('/api/auth/me').expect(401);
  });

  it('ending needs the CSRF token like any other write', async () => {
    world = await makeWorld();
    const here = await signIn(world.app, 'lead');
    await here.agent.post('/api/auth/sessions/end-others').expect(403);
  });
});

describe('browserSummary', () => {
  it('names the browser, its major version and the system, from user agents as MDN gives them', () => {
    expect(browserSummary(FIREFOX_LINUX)).toBe('Firefox 133 on Linux');
    expect(browserSummary(CHROME_WINDOWS)).toBe('Chrome 131 on Windows');
    // supertest's and curl's own agents name no browser.
    expect(browserSummary('curl/8.5.0')).toBeNull();
    expect(browserSummary(null)).toBeNull();
  });
});
