import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { emails, makeWorld, openLink, PASSWORD, signIn, type World } from '../support/world';

let current: World | undefined;
afterEach(async () => current?.db.destroy());
const world = async () => (current = await makeWorld());

const fieldMessage = (res: request.Response, field: string) => (res.body.error?.details as { path: string; message: string }[] | undefined)?.find((d) => d.path === field)?.message;

describe('the password rules on every way of setting one', () => {
  it('a new account made by the site admin: refuses short, common and own-word passwords on the password field', async () => {
    const w = await world();
    const { agent, csrf } = await signIn(w.app, 'admin');
    const make = (password: string) => agent.post('/api/users').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, email: 'nadia.vell@test.invalid', name: 'Nadia Vell', password });
    for (const [password, words] of [
      ['1234567890', /at least 12/],
      ['night sky '.repeat(13), /at most 128 characters/],
      ['123456789012', /most common/],
      ['nadia.vell@test.invalid', /your e-mail/],
      ['NadiaVell2026', /your name/],
      ['starledger2026', /Starledger/],
    ] as const) {
      const res = await make(password);
      expect(res.status, password).toBe(400);
      expect(fieldMessage(res, 'password'), password).toMatch(words);
    }
    expect(await w.db('users').where({ email: 'nadia.vell@test.invalid' }).first()).toBeUndefined();
    await make('the dome opens at dusk '.repeat(6).slice(0, 128)).expect(201);
  });

  it('accepting an invitation: refuses the invited address as the password and keeps the link usable', async () => {
    const w = await world();
    const token = await openLink(w, 'invitation', { email: 'orrin.marsh@test.invalid' });
    const own = await request(w.app).post('/api/invitations/accept').send({ token, name: 'Orrin Marsh', password: 'orrin.marsh2026' });
    expect(own.status).toBe(400);
    expect(fieldMessage(own, 'password')).toMatch(/your e-mail/);
    const common = await request(w.app).post('/api/invitations/accept').send({ token, name: 'Orrin Marsh', password: 'qwertyuiopasdfgh' });
    expect(fieldMessage(common, 'password')).toMatch(/most common/);
    await request(w.app).post('/api/invitations/accept').send({ token, name: 'Orrin Marsh', password: 'lantern over the ridge' }).expect(201);
  });

  it('a reset link: refuses a common password and one made of the account e-mail, and the old password still works', async () => {
    const w = await world();
    const token = await openLink(w, 'reset', { email: emails.reader });
    for (const password of ['password1234', emails.reader]) {
      const res = await request(w.app).post('/api/auth/password-reset/complete').send({ token, password });
      expect(res.status, password).toBe(400);
      expect(fieldMessage(res, 'password'), password).toBeTruthy();
    }
    await request(w.app).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
  });
});

describe('changing my password while signed in', () => {
  it('needs the current password, keeps this session and ends every other one', async () => {
    const w = await world();
    const here = await signIn(w.app, 'observer');
    const elsewhere = await signIn(w.app, 'observer');
    const wrong = await here.agent.post('/api/auth/password').set('X-CSRF-Token', here.csrf).send({ currentPassword: 'not-my-password', password: 'quiet nights at the summit' });
    expect(wrong.status).toBe(400);
    expect(fieldMessage(wrong, 'currentPassword')).toBe('This is not your current password.');
    await elsewhere.agent.get('/api/auth/me').expect(200);

    const changed = await here.agent.post('/api/auth/password').set('X-CSRF-Token', here.csrf).send({ currentPassword: PASSWORD, password: 'quiet nights at the summit' });
    expect(changed.status, JSON.stringify(changed.body)).toBe(200);
    expect(changed.body.user.email).toBe(emails.observer);
    // This browser carries on with the token of its new session; the other is signed out.
    const me = await here.agent.get('/api/auth/me').expect(200);
    expect(me.body.csrfToken).toBe(changed.body.csrfToken);
    await here.agent.post(`/api/projects/${w.projectId}/targets`).set('X-CSRF-Token', changed.body.csrfToken).send({ designation: 'After 1', ra: '01 00 00', dec: '+01 00 00' }).expect(201);
    await elsewhere.agent.get('/api/auth/me').expect(401);
    await request(w.app).post('/api/auth/login').send({ email: emails.observer, password: PASSWORD }).expect(401);
    await request(w.app).post('/api/auth/login').send({ email: emails.observer, password: 'quiet nights at the summit' }).expect(200);
    const trail = await w.db('trail_events').where({ action: 'user.password_changed', entity_id: w.userIds.observer });
    expect(trail).toHaveLength(1);
  });

  it('refuses a new password the rules refuse, and leaves the old one in place', async () => {
    const w = await world();
    const { agent, csrf } = await signIn(w.app, 'observer');
    const res = await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, password: `${emails.observer}` });
    expect(res.status).toBe(400);
    expect(fieldMessage(res, 'password')).toMatch(/your e-mail/);
    await agent.get('/api/auth/me').expect(200);
    await request(w.app).post('/api/auth/login').send({ email: emails.observer, password: PASSWORD }).expect(200);
  });

  it('counts wrong current passwords in the sign-in throttle, so a borrowed session cannot guess it', async () => {
    const w = await world();
    const { agent, csrf } = await signIn(w.app, 'observer');
    for (let i = 0; i < 5; i++) {
      await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: `guess-${i}`, password: 'quiet nights at the summit' }).expect(400);
    }
    const res = await agent.post('/api/auth/password').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, password: 'quiet nights at the summit' });
    expect(res.status).toBe(429);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  });
});
