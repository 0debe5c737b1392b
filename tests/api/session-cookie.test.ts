import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { emails, makeWorld, PASSWORD, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const sessionCookie = (res: request.Response) => (res.headers['set-cookie'] as unknown as string[] | undefined)?.find((c) => c.startsWith('starledger.sid='));

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
    const attributes = sessionCookie(res)!.split(';').slice(1).map((a) => a.trim().toLowerCase());
    expect(attributes).toEqual(expect.arrayContaining(['secure', 'httponly', 'samesite=lax', 'path=/']));
    // The cookie names no Domain, so no other host under the same domain receives it (RFC 6265 §5.3 step 6: host-only).
    expect(attributes.some((a) => a.startsWith('domain='))).toBe(false);
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
