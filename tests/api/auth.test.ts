import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

describe('sign-in', () => {
  it('signs in, says who I am with my memberships, and signs out', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe(emails.observer);
    expect(me.body.memberships).toEqual([{ projectId: world.projectId, role: 'observer' }]);
    expect(me.body.user).not.toHaveProperty('passwordHash');
    await agent.post('/api/auth/logout').set('X-CSRF-Token', csrf).expect(204);
    await agent.get('/api/auth/me').expect(401);
  });

  it('answers a wrong password and an unknown e-mail with the same 401 and message', async () => {
    world = await makeWorld();
    const wrong = await request(world.app).post('/api/auth/login').send({ email: emails.lead, password: 'not-the-password' });
    const unknown = await request(world.app).post('/api/auth/login').send({ email: 'nobody@test.invalid', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    expect(wrong.body.error.message).not.toMatch(/exist|unknown|no account/i);
  });

  it('issues a new session id at sign-in and an httpOnly, sameSite cookie', async () => {
    world = await makeWorld();
    const agent = request.agent(world.app);
    // Any earlier session id must not survive sign-in (session fixation).
    const first = await agent.post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    const cookie1 = String(first.headers['set-cookie']);
    expect(cookie1).toMatch(/HttpOnly/i);
    expect(cookie1).toMatch(/SameSite=Lax/i);
    const second = await agent.post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    const sid = (c: string) => /starledger\.sid=([^;]+)/.exec(c)?.[1];
    expect(sid(String(second.headers['set-cookie']))).not.toBe(sid(cookie1));
  });

  it('stores sessions in the database', async () => {
    world = await makeWorld();
    await signIn(world.app, 'reader');
    const row = await world.db('sessions').count<{ n: number }>('* as n').first();
    expect(Number(row!.n)).toBe(1);
  });

  it('refuses a write made with the session cookie but without the CSRF token', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const body = { designation: 'CSRF 1', ra: '01 00 00', dec: '+01 00 00' };
    const res = await agent.post(`/api/projects/${world.projectId}/targets`).send(body);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
    await agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', 'forged').send(body).expect(403);
    await agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', csrf).send(body).expect(201);
  });

  it('answers malformed JSON with 400 and no stack trace', async () => {
    world = await makeWorld();
    const res = await request(world.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_json');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
  });

  it('names the field in a validation error', async () => {
    world = await makeWorld();
    const res = await request(world.app).post('/api/auth/login').send({ email: 'not-an-email', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toContainEqual({ path: 'email', message: expect.any(String) });
  });

  it('sets helmet headers', async () => {
    world = await makeWorld();
    const res = await request(world.app).get('/api/auth/me');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
  });
});
