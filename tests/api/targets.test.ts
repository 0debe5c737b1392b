import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const targetsUrl = (w: World) => `/api/projects/${w.projectId}/targets`;

describe('targets', () => {
  it('creates a target from sexagesimal coordinates and records it in the review trail', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const res = await agent
      .post(targetsUrl(world))
      .set('X-CSRF-Token', csrf)
      .send({ designation: 'GX 7', ra: '5h14m32.3s', dec: '-08:12:05', tags: ['dwarf'], notes: 'first night' })
      .expect(201);
    // 5h14m32.3s = (5 + 14/60 + 32.3/3600) × 15° = 78.634583…°; −8°12′05″ = −8.201389…°
    expect(res.body.target.raDeg).toBeCloseTo(78.6345833, 6);
    expect(res.body.target.decDeg).toBeCloseTo(-8.2013889, 6);
    const trail = await world.db('trail_events').where({ action: 'target.created' });
    expect(trail).toHaveLength(1);
    expect(trail[0].actor_user_id).toBe(world.userIds.observer);
  });

  it('refuses a designation that differs only in case and spaces, naming the field', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'lead');
    const res = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: 't  1', ra: 1, dec: 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.details).toEqual([{ path: 'designation', message: expect.any(String) }]);
  });

  it.each([
    ['ra', '25 00 00', /hours/],
    ['ra', '360.5', /0–360/],
    ['dec', '+95 00 00', /−90° and \+90°/],
    ['dec', 'north', /not sexagesimal/],
  ])('rejects %s = %s with a message naming the field', async (field, value, message) => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'lead');
    const body = { designation: 'Bad 1', ra: '01 00 00', dec: '+01 00 00', [field]: value };
    const res = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe(field);
    expect(res.body.error.details[0].message).toMatch(message);
    expect(await world.db('targets').where({ designation: 'Bad 1' })).toHaveLength(0);
  });

  it('pages, sorts and filters on the server', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    for (let i = 2; i <= 12; i++) {
      await agent
        .post(targetsUrl(world))
        .set('X-CSRF-Token', csrf)
        .send({ designation: `T ${i}`, ra: i * 10, dec: i - 6, tags: i % 2 ? ['odd'] : [] })
        .expect(201);
    }
    const page2 = await agent.get(`${targetsUrl(world)}?page=2&pageSize=5&sort=raDeg&order=desc`).expect(200);
    expect(page2.body.total).toBe(12);
    expect(page2.body.items.map((t: { raDeg: number }) => t.raDeg)).toEqual([70, 60, 50, 40, 30]);
    const odd = await agent.get(`${targetsUrl(world)}?tag=odd`).expect(200);
    expect(odd.body.total).toBe(5);
    const search = await agent.get(`${targetsUrl(world)}?q=t1`).expect(200);
    expect(search.body.items.map((t: { designation: string }) => t.designation).sort()).toEqual(['T 1', 'T 10', 'T 11', 'T 12']);
    const bad = await agent.get(`${targetsUrl(world)}?sort=colour`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('sort');
  });

  it('edits and deletes, keeping the before and after in the trail', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'lead');
    const url = `${targetsUrl(world)}/${world.targetId}`;
    await agent.patch(url).set('X-CSRF-Token', csrf).send({ notes: 'Variable?' }).expect(200);
    await agent.delete(url).set('X-CSRF-Token', csrf).expect(204);
    await agent.get(url).expect(404);
    const trail = await world.db('trail_events').orderBy('id');
    expect(trail.map((e: { action: string }) => e.action)).toEqual(['target.updated', 'target.deleted']);
    expect(JSON.parse(trail[0].before_json).notes).toBe('');
    expect(JSON.parse(trail[0].after_json).notes).toBe('Variable?');
  });

  it('does not find another project’s target through this project', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'outsider');
    await agent.get(`/api/projects/${world.otherProjectId}/targets/${world.targetId}`).expect(404);
    await agent.patch(`/api/projects/${world.otherProjectId}/targets/${world.targetId}`).set('X-CSRF-Token', csrf).send({ notes: 'x' }).expect(404);
  });
});
