import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { emails, makeWorld, PASSWORD, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const setCookies = (res: request.Response) => (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];
const sessionCookie = (res: request.Response, name = 'starledger.sid') => setCookies(res).find((c) => c.startsWith(`${name}=`));

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('the session cookie', () => {
  it('once signed out, the same cookie sent again is refused: the session is gone from the server, not only from the browser (ASVS 3.3.1)', async () => {
    world = await makeWorld();
    const login = await request(world.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const cookie = sessionCookie(login)!.split(';')[0];
    await request(world.app).get('/api/auth/me').set('Cookie', cookie).expect(200);
    await request(world.app).post('/api/auth/logout').set('Cookie', cookie).set('X-CSRF-Token', login.body.csrfToken).expect(204);
    expect(Number((await world.db('sessions').count('* as n').first())?.n)).toBe(0);
    await request(world.app).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });

  it('is Secure, HttpOnly, SameSite=Lax and for the whole site when COOKIE_SECURE is set and the request came over HTTPS (ASVS 3.4.1–3.4.3, 3.4.5; RFC 6265 §4.1.2)', async () => {
    world = await makeWorld();
    const app = createApp({ db: world.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, secureCookies: true });
    // supertest connects over loopback, the proxy trusted by default, which says the client used HTTPS.
    const res = await request(app).post('/api/auth/login').set('X-Forwarded-Proto', 'https').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const attributes = sessionCookie(res, '__Host-starledger.sid')!.split(';').slice(1).map((a) => a.trim().toLowerCase());
    expect(attributes).toEqual(expect.arrayContaining(['secure', 'httponly', 'samesite=lax', 'path=/']));
    // The cookie names no Domain, so no other host under the same domain receives it (RFC 6265 §5.3 step 6: host-only).
    expect(attributes.some((a) => a.startsWith('domain='))).toBe(false);
  });

  it('is named with the __Host- prefix when COOKIE_SECURE is set, so no other host or plain-HTTP answer can set it; cleared under that name on sign-out (ASVS 3.4.4; RFC 6265bis §4.1.3.2)', async () => {
    world = await makeWorld();
    const app = createApp({ db: world.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, secureCookies: true });
    const login = await request(app).post('/api/auth/login').set('X-Forwarded-Proto', 'https').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const names = setCookies(login).map((c) => c.split('=')[0]);
    expect(names).toEqual(['__Host-starledger.sid']);
    // RFC 6265bis §4.1.3.2: a __Host- cookie is taken only with Secure, Path=/ and no Domain.
    const attributes = sessionCookie(login, '__Host-starledger.sid')!.split(';').slice(1).map((a) => a.trim().toLowerCase());
    expect(attributes).toEqual(expect.arrayContaining(['secure', 'path=/']));
    expect(attributes.some((a) => a.startsWith('domain='))).toBe(false);

    const cookie = sessionCookie(login, '__Host-starledger.sid')!.split(';')[0];
    await request(app).get('/api/auth/me').set('X-Forwarded-Proto', 'https').set('Cookie', cookie).expect(200);
    // The old name no longer opens the session.
    await request(app).get('/api/auth/me').set('X-Forwarded-Proto', 'https').set('Cookie', cookie.replace('__Host-', '')).expect(401);
    const out = await request(app).post('/api/auth/logout').set('X-Forwarded-Proto', 'https').set('Cookie', cookie).set('X-CSRF-Token', login.body.csrfToken).expect(204);
    // A browser drops a __Host- cookie only for a Set-Cookie that could itself have set it: Secure, Path=/, an expiry in the past.
    const cleared = sessionCookie(out, '__Host-starledger.sid')!.split(';').map((a) => a.trim().toLowerCase());
    expect(cleared[0]).toBe('__host-starledger.sid=');
    expect(cleared).toEqual(expect.arrayContaining(['secure', 'path=/', 'expires=thu, 01 jan 1970 00:00:00 gmt']));
  });

  it('keeps its plain name without COOKIE_SECURE, where a __Host- cookie (Secure only) would be dropped over plain HTTP', async () => {
    world = await makeWorld();
    const login = await request(world.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    expect(setCookies(login).map((c) => c.split('=')[0])).toEqual(['starledger.sid']);
    expect(sessionCookie(login)!.toLowerCase()).not.toContain('secure');
  });

  it('never travels in a URL: no answer carries the session id outside Set-Cookie (ASVS 3.1.1)', async () => {
    world = await makeWorld();
    const login = await request(world.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
    const sid = decodeURIComponent(sessionCookie(login)!.split(';')[0].slice('starledger.sid='.length));
    const me = await request(world.app).get('/api/auth/me').set('Cookie', `starledger.sid=${encodeURIComponent(sid)}`).expect(200);
    for (const res of [login, me]) {
      expect(res.text).not.toContain(sid.slice(2, 26));
      expect(JSON.stringify({ ...res.headers, 'set-cookie': undefined })).not.toContain(sid.slice(2, 26));
    }
  });
});
