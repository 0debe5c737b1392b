import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { hashPassword } from '../../server/lib/passwords';
import { emails, makeWorld, openLink, PASSWORD, signIn, type World } from '../support/world';

let current: World | undefined;
afterEach(async () => current?.db.destroy());
const world = async () => (current = await makeWorld());

const fieldMessage = (res: request.Response, field: string) => (res.body.error?.details as { path: string; message: string }[] | undefined)?.find((d) => d.path === field)?.message;

/** The routes open to an account that must choose a new password first: its session, sign-out and the change (server/routes.ts, ownAccount). */
const OPEN_BEFORE_CHANGE = ['GET /auth/me', 'POST /auth/logout', 'POST /auth/password'];

/**
 * Every route that needs a signed-in caller, as the OpenAPI document lists
 * them (it is made from server/routes.ts: a route without `security` is
 * open to anyone), with its parameters filled in: the refusal comes before
 * they are read.
 */
async function routesNeedingSignIn(w: World): Promise<{ method: 'get' | 'post' | 'patch' | 'delete'; path: string; key: string }[]> {
  const { agent } = await signIn(w.app, 'observer');
  const doc = (await agent.get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, { security?: unknown[] }>> };
  return Object.entries(doc.paths).flatMap(([path, operations]) =>
    Object.entries(operations)
      .filter(([, op]) => (op.security?.length ?? 0) > 0)
      .map(([method]) => ({ method: method as 'get' | 'post' | 'patch' | 'delete', path: path.replace(/\{\w+\}/g, '1'), key: `${method.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}` })),
  );
}

describe('an account that must choose a new password before anything else', () => {
  // "123456789012" is in the top of the OWASP SecLists 10-million list that
  // Mozilla's fxa-common-password-list is drawn from (ASVS 2.1.7), so a new
  // password may not be it; an account made before the rule may still have it.
  it('signs in with a password now refused for new ones, is refused on every other route with 403 password_change_required, and is let through once it chose a new one', async () => {
    const w = await world();
    const { agent: before, csrf: beforeCsrf } = await signIn(w.app, 'reader');
    const token = (await before.post('/api/tokens').set('X-CSRF-Token', beforeCsrf).send({ currentPassword: PASSWORD, name: 'night pipeline' }).expect(201)).body.token as string;
    await w.db('users').where({ id: w.userIds.reader }).update({ password_hash: await hashPassword('123456789012') });

    const agent = request.agent(w.app);
    const login = await agent.post('/api/auth/login').send({ email: emails.reader, password: '123456789012' }).expect(200);
    expect(login.body.user.mustChangePassword).toBe('weak');
    const csrf = login.body.csrfToken as string;
    expect((await w.db('users').where({ id: w.userIds.reader }).first()).must_change_password).toBe('weak');

    const refused: string[] = [];
    for (const route of await routesNeedingSignIn(w)) {
      if (OPEN_BEFORE_CHANGE.includes(route.key)) continue;
      const res = await agent[route.method](`/api${route.path}`).set('X-CSRF-Token', csrf).send({});
      expect(res.status, route.key).toBe(403);
      expect(res.body.error.code, route.key).toBe('password_change_required');
      refused.push(route.key);
    }
    expect(refused.length).toBeGreaterThan(40);
    const projects = await agent.get('/api/projects').expect(403);
    expect(projects.body.error.message).toMatch(/now refused for new passwords.*Choose a new one/);
    expect(projects.body.error.details).toEqual({ reason: 'weak' });
    // An API token of the account is held back the same way.
    const byToken = await request(w.app).get('/api/projects').set('Authorization', `Bearer ${token}`).expect(403);
    expect(byToken.body.error.code).toBe('password_change_required');

    expect((await agent.get('/api/auth/me').expect(200)).body.user.mustChangePassword).toBe('weak');
    const again = await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: '123456789012', password: '123456789012' });
    expect(again.status).toBe(400);
    expect(fieldMessage(again, 'password')).toBeTruthy();
    const changed = await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: '123456789012', password: 'slow clouds over the far ridge' }).expect(200);
    expect(changed.body.user.mustChangePassword).toBeNull();
    await agent.get('/api/projects').expect(200);
    await request(w.app).get('/api/projects').set('Authorization', `Bearer ${token}`).expect(200);
    expect((await w.db('users').where({ id: w.userIds.reader }).first()).must_change_password).toBeNull();
  }, 60_000);

  it('a password that still passes the rules signs in with nothing to change', async () => {
    const w = await world();
    const { agent } = await signIn(w.app, 'observer');
    expect((await agent.get('/api/auth/me').expect(200)).body.user.mustChangePassword).toBeNull();
    await agent.get('/api/projects').expect(200);
  });

  it('an account a site admin makes under Accounts must choose its own password at the first sign-in, and may not keep the one typed for it', async () => {
    const w = await world();
    const { agent: admin, csrf: adminCsrf } = await signIn(w.app, 'admin');
    const made = await admin.post('/api/users').set('X-CSRF-Token', adminCsrf).send({ currentPassword: PASSWORD, email: 'tamsin.rook@test.invalid', name: 'Tamsin Rook', password: 'given by the admin once' }).expect(201);
    expect(made.body.user.mustChangePassword).toBe('initial');

    const agent = request.agent(w.app);
    const login = await agent.post('/api/auth/login').send({ email: 'tamsin.rook@test.invalid', password: 'given by the admin once' }).expect(200);
    expect(login.body.user.mustChangePassword).toBe('initial');
    const csrf = login.body.csrfToken as string;
    const projects = await agent.get('/api/projects').expect(403);
    expect(projects.body.error).toMatchObject({ code: 'password_change_required', details: { reason: 'initial' } });
    expect(projects.body.error.message).toMatch(/site admin chose the password/);

    const same = await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: 'given by the admin once', password: 'given by the admin once' });
    expect(same.status).toBe(400);
    expect(fieldMessage(same, 'password')).toMatch(/other than your current one/);
    await agent.get('/api/projects').expect(403);

    await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: 'given by the admin once', password: 'my own words for the dome' }).expect(200);
    await agent.get('/api/projects').expect(200);
    const relogin = await request(w.app).post('/api/auth/login').send({ email: 'tamsin.rook@test.invalid', password: 'my own words for the dome' }).expect(200);
    expect(relogin.body.user.mustChangePassword).toBeNull();
  }, 30_000);

  it('a completed reset link clears it as any new password does', async () => {
    const w = await world();
    await w.db('users').where({ id: w.userIds.pi }).update({ must_change_password: 'initial' });
    const before = await request(w.app).post('/api/auth/login').send({ email: emails.pi, password: PASSWORD }).expect(200);
    expect(before.body.user.mustChangePassword).toBe('initial');
    const token = await openLink(w, 'reset', { email: emails.pi });
    await request(w.app).post('/api/auth/password-reset/complete').send({ token, password: 'the long way round the hill' }).expect(200);
    const after = await request(w.app).post('/api/auth/login').send({ email: emails.pi, password: 'the long way round the hill' }).expect(200);
    expect(after.body.user.mustChangePassword).toBeNull();
  });
});
