import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

describe('response headers', () => {
  it('marks every API answer no-store: signed in, anonymous, refused and unknown routes alike', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    const answers = {
      targets: await agent.get(`/api/projects/${world.projectId}/targets`),
      me: await agent.get('/api/auth/me'),
      anonymous: await request(world.app).get('/api/projects'),
      unknown: await request(world.app).get('/api/no-such-route'),
    };
    expect(answers.anonymous.status).toBe(401);
    for (const [which, res] of Object.entries(answers)) expect(res.headers['cache-control'], which).toBe('no-store');
  });

  it('sends HSTS only on a request that came over HTTPS, judged by a trusted proxy’s X-Forwarded-Proto', async () => {
    world = await makeWorld();
    const plain = await request(world.app).get('/api/auth/me');
    expect(plain.headers['strict-transport-security']).toBeUndefined();
    // supertest connects over loopback, the proxy trusted by default.
    const viaProxy = await request(world.app).get('/api/auth/me').set('X-Forwarded-Proto', 'https');
    expect(viaProxy.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');

    // A proxy not trusted cannot claim HTTPS for the client.
    const untrusting = createApp({ db: world.db, sessionSecret: 's', sessionCleanupIntervalMs: 0, trustProxy: '10.0.0.1' });
    const claimed = await request(untrusting).get('/api/auth/me').set('X-Forwarded-Proto', 'https');
    expect(claimed.headers['strict-transport-security']).toBeUndefined();
  });
});
