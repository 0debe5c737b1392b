import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('what every answer tells a browser', () => {
  it('refuses to be framed by another site, sends no referrer and names no server software (ASVS 14.4.6, 14.4.7, 14.3.3)', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    for (const res of [await agent.get('/api/auth/me'), await request(world.app).get('/api/no-such-route')]) {
      // frame-ancestors per CSP Level 2 §7.7, X-Frame-Options per RFC 7034 §2.1, for browsers without CSP.
      expect(res.headers['content-security-policy']).toMatch(/(^|;)\s*frame-ancestors 'self'\s*(;|$)/);
      expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      expect(res.headers['x-powered-by']).toBeUndefined();
      expect(res.headers.server).toBeUndefined();
    }
  });

  it('labels every JSON answer, refusals and errors included, as UTF-8 JSON (ASVS 14.4.1; RFC 8259 §8.1)', async () => {
    world = await makeWorld();
    const answers = [
      await request(world.app).get('/api/projects'),
      await request(world.app).post('/api/auth/login').send({ email: 'not-an-email', password: 'x' }),
      await request(world.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": '),
      await request(world.app).get('/api/no-such-route'),
    ];
    expect(answers.map((r) => r.status)).toEqual([401, 400, 400, 404]);
    for (const res of answers) expect(res.headers['content-type']).toBe('application/json; charset=utf-8');
  });

  it('grants no other origin anything: no CORS header, even to a request that names an Origin (ASVS 14.5.3; Fetch standard §3.2.3)', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    const read = await agent.get(`/api/projects/${world.projectId}/targets`).set('Origin', 'https://elsewhere.test.invalid');
    expect(read.status).toBe(200);
    const preflight = await request(world.app)
      .options(`/api/projects/${world.projectId}/targets`)
      .set('Origin', 'https://elsewhere.test.invalid')
      .set('Access-Control-Request-Method', 'POST');
    for (const res of [read, preflight]) {
      expect(res.headers['access-control-allow-origin']).toBeUndefined();
      expect(res.headers['access-control-allow-credentials']).toBeUndefined();
    }
  });
});
