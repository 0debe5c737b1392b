import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';
import { movableClock } from '../support/movable-clock';

let world: World;
afterEach(async () => world?.db.destroy());

const MINUTE = 60_000;

/**
 * OWASP ASVS 4.0.3 3.3.2, level 2: "If authenticators permit users to remain
 * logged in, verify that re-authentication occurs periodically both when
 * actively used or after an idle period": 12 hours, or 30 minutes of
 * inactivity. Time passes on the app's clock (tests/support/movable-clock.ts).
 */
describe('how long a signed-in session lasts (ASVS 3.3.2)', () => {
  it('ends after 30 minutes without use: 401 session_ended saying so, while use within them keeps it', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const reader = await signIn(world.app, 'reader');
    clock.advance(29 * MINUTE);
    await reader.agent.get('/api/auth/me').expect(200);
    clock.advance(29 * MINUTE);
    await reader.agent.get('/api/projects').expect(200);
    clock.advance(30 * MINUTE);
    const ended = await reader.agent.get('/api/projects').expect(401);
    expect(ended.body.error.code).toBe('session_ended');
    expect(ended.body.error.message).toBe('Your session ended after 30 minutes without use. Sign in again.');
    // The session is gone from the server, so the same cookie never opens it again.
    expect(await world.db('sessions').where({ user_id: world.userIds.reader }).count('* as n').first()).toMatchObject({ n: 0 });
    await reader.agent.get('/api/auth/me').expect(401);
  });

  it('ends 12 hours after sign-in even when used all along, and a new sign-in then works through the same browser', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const observer = await signIn(world.app, 'observer');
    for (let minutes = 20; minutes < 12 * 60; minutes += 20) {
      clock.advance(20 * MINUTE);
      await observer.agent.get('/api/auth/me').expect(200);
    }
    clock.advance(20 * MINUTE);
    const ended = await observer.agent.get('/api/auth/me').expect(401);
    expect(ended.body.error).toMatchObject({ code: 'session_ended', message: 'Your session ended 12 hours after you signed in. Sign in again.' });
    const again = await observer.agent.post('/api/auth/login').send({ email: emails.observer, password: PASSWORD }).expect(200);
    await observer.agent.get('/api/projects').set('X-CSRF-Token', again.body.csrfToken).expect(200);
  });

  it('a sign-in made with the cookie of a session that has just ended goes through', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const pi = await signIn(world.app, 'pi');
    clock.advance(31 * MINUTE);
    await pi.agent.post('/api/auth/login').send({ email: emails.pi, password: PASSWORD }).expect(200);
    await pi.agent.get('/api/auth/me').expect(200);
  });

  it('takes its limits from the settings (SESSION_MAX_HOURS, SESSION_IDLE_MINUTES)', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const app = createApp({ db: world.db, clock, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, sessionLimits: { maxHours: 1, idleMinutes: 5 } });
    const agent = request.agent(app);
    await agent.post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    clock.advance(4 * MINUTE);
    await agent.get('/api/auth/me').expect(200);
    clock.advance(5 * MINUTE);
    expect((await agent.get('/api/auth/me').expect(401)).body.error.message).toBe('Your session ended after 5 minutes without use. Sign in again.');

    await agent.post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    for (let i = 0; i < 14; i++) {
      clock.advance(4 * MINUTE);
      await agent.get('/api/auth/me').expect(200);
    }
    clock.advance(4 * MINUTE);
    expect((await agent.get('/api/auth/me').expect(401)).body.error.message).toBe('Your session ended 1 hour after you signed in. Sign in again.');
  });

  it('ends a session stored before sign-in times were kept, at its next request', async () => {
    world = await makeWorld();
    const reader = await signIn(world.app, 'reader');
    await world.db('sessions').update({ signed_in_at: null, last_seen_at: null });
    expect((await reader.agent.get('/api/auth/me').expect(401)).body.error).toMatchObject({ code: 'session_ended', message: 'Your session has ended. Sign in again.' });
  });

  it('keeps the session’s sign-in time through the saves after sign-in, and its last use at most a minute behind', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const lead = await signIn(world.app, 'lead');
    const [before] = await world.db('sessions').select('signed_in_at', 'last_seen_at');
    clock.advance(10 * MINUTE);
    // A write saves the session (and would once have blanked the other columns on SQLite).
    await lead.agent.post('/api/tokens').set('X-CSRF-Token', lead.csrf).send({ currentPassword: PASSWORD, name: 'night pipeline' }).expect(201);
    const [after] = await world.db('sessions').select('signed_in_at', 'last_seen_at');
    expect(new Date(after.signed_in_at).toISOString()).toBe(new Date(before.signed_in_at).toISOString());
    expect(new Date(after.last_seen_at).toISOString()).toBe('2026-12-01T03:10:00.000Z');
  });

  it('leaves a request with an API token alone (tokens have their own expiry)', async () => {
    const clock = movableClock();
    world = await makeWorld({ clock });
    const lead = await signIn(world.app, 'lead');
    const made = await lead.agent.post('/api/tokens').set('X-CSRF-Token', lead.csrf).send({ currentPassword: PASSWORD, name: 'night pipeline' }).expect(201);
    clock.advance(13 * 60 * MINUTE);
    await request(world.app).get('/api/projects').set('Authorization', `Bearer ${made.body.token}`).expect(200);
  });
});
