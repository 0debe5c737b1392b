import { afterEach, describe, expect, it } from 'vitest';
import * as fill from '../../migrations/20261202090100_project_target_count_fill';
import { commitFile } from '../support/night';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

describe('the target list’s total', () => {
  it('follows targets made by hand, by an upload and deleted, without counting the project per page', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const total = async (query = '') => (await s.agent.get(`/api/projects/${world.projectId}/targets?pageSize=2${query}`).expect(200)).body.total;
    expect(await total()).toBe(1);

    const made = await s.agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', s.csrf).send({ designation: 'H 1', ra: 1, dec: 1 }).expect(201);
    await commitFile(s, world, ['target,ra,dec,quantity,value,uncertainty,unit,band', 'U 1,10,10,magnitude,7,0.02,mag,V', 'U 2,11,11,magnitude,8,0.02,mag,V', 'U 3,12,12,magnitude,9,0.02,mag,V'].join('\n'));
    expect(await total()).toBe(5);
    // A filter still counts what it matches.
    expect(await total('&q=U')).toBe(3);

    const lead = await signIn(world.app, 'lead');
    await lead.agent.delete(`/api/projects/${world.projectId}/targets/${made.body.target.id}`).set('X-CSRF-Token', lead.csrf).expect(204);
    expect(await total()).toBe(4);
    // The other project's count is its own.
    expect((await world.db('projects').where({ id: world.otherProjectId }).first()).target_count).toBe(0);
  });

  it('counts the targets a project had before the column existed', async () => {
    world = await makeWorld();
    await world.db('projects').update({ target_count: 0 });
    await fill.up(world.db);
    expect((await world.db('projects').where({ id: world.projectId }).first()).target_count).toBe(1);
    expect((await world.db('projects').where({ id: world.otherProjectId }).first()).target_count).toBe(0);
  });
});
