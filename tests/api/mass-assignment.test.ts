import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, openLink, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

// OWASP ASVS 4.0.3 5.1.2: fields a request may not set are not taken from its body (docs/security.md).
describe('fields a request body may not set', () => {
  it('an invitee who adds isSiteAdmin and a lead role to the acceptance gets neither', async () => {
    world = await makeWorld();
    const token = await openLink(world, 'invitation', { email: 'wren.tallis@test.invalid' });
    const res = await request(world.app)
      .post('/api/invitations/accept')
      .send({ token, name: 'Wren Tallis', password: 'lantern over the ridge', isSiteAdmin: true, is_site_admin: 1, role: 'lead' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const user = await world.db('users').where({ email: 'wren.tallis@test.invalid' }).first();
    expect(Boolean(user.is_site_admin)).toBe(false);
    // openLink invites as reader.
    expect(await world.db('project_members').where({ user_id: user.id }).select('project_id', 'role')).toEqual([{ project_id: world.projectId, role: 'reader' }]);
  });

  it('a target made with another project’s id in its body lands in the project of the address, or nowhere', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const res = await agent
      .post(`/api/projects/${world.projectId}/targets`)
      .set('X-CSRF-Token', csrf)
      .send({ designation: 'Stray 1', ra: '01 00 00', dec: '+01 00 00', projectId: world.otherProjectId, project_id: world.otherProjectId });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(await world.db('targets').where({ designation: 'Stray 1' }).select('project_id')).toEqual([{ project_id: world.projectId }]);
  });
});
