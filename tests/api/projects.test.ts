import { afterEach, describe, expect, it } from 'vitest';
import { emails, makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const site = { name: 'North Dome', latitudeDeg: 52.1, longitudeDeg: -3.4, elevationM: 320, timeZone: 'Europe/London' };

describe('projects and members', () => {
  it('a site admin creates a project with its lead, who then sees it', async () => {
    world = await makeWorld();
    const admin = await signIn(world.app, 'admin');
    const res = await admin.agent
      .post('/api/projects')
      .set('X-CSRF-Token', admin.csrf)
      .send({ name: 'Winter run', code: 'WINTER', site, leadEmail: emails.reader })
      .expect(201);
    const reader = await signIn(world.app, 'reader');
    const mine = await reader.agent.get('/api/projects').expect(200);
    const created = mine.body.projects.find((p: { id: number }) => p.id === res.body.project.id);
    expect(created.myRole).toBe('lead');
  });

  it('writes nothing when the lead’s e-mail has no account', async () => {
    world = await makeWorld();
    const admin = await signIn(world.app, 'admin');
    const res = await admin.agent
      .post('/api/projects')
      .set('X-CSRF-Token', admin.csrf)
      .send({ name: 'Orphan', code: 'ORPHAN', site, leadEmail: 'nobody@test.invalid' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('leadEmail');
    expect(await world.db('projects').where({ code: 'ORPHAN' })).toHaveLength(0);
  });

  it('names a nested field that is out of range', async () => {
    world = await makeWorld();
    const admin = await signIn(world.app, 'admin');
    const res = await admin.agent
      .post('/api/projects')
      .set('X-CSRF-Token', admin.csrf)
      .send({ name: 'X', code: 'XX', site: { ...site, latitudeDeg: 91 } });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('site.latitudeDeg');
  });

  it('a lead adds a member, changes the role, and cannot demote the last lead', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    const url = `/api/projects/${world.projectId}/members`;
    await lead.agent.post(url).set('X-CSRF-Token', lead.csrf).send({ email: emails.admin, role: 'reader' }).expect(201);
    await lead.agent.patch(`${url}/${world.userIds.admin}`).set('X-CSRF-Token', lead.csrf).send({ role: 'observer' }).expect(200);
    const demote = await lead.agent.patch(`${url}/${world.userIds.lead}`).set('X-CSRF-Token', lead.csrf).send({ role: 'reader' });
    expect(demote.status).toBe(409);
    const members = await lead.agent.get(url).expect(200);
    expect(members.body.members.find((m: { userId: number }) => m.userId === world.userIds.lead).role).toBe('lead');
    const actions = (await world.db('trail_events').orderBy('id')).map((e: { action: string }) => e.action);
    expect(actions).toEqual(['member.added', 'member.role_changed']);
  });

  it('a removed member loses access at once', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    const observer = await signIn(world.app, 'observer');
    await observer.agent.get(`/api/projects/${world.projectId}`).expect(200);
    await lead.agent.delete(`/api/projects/${world.projectId}/members/${world.userIds.observer}`).set('X-CSRF-Token', lead.csrf).expect(204);
    await observer.agent.get(`/api/projects/${world.projectId}`).expect(404);
  });
});
