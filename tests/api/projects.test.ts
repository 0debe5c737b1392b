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

  it('keeps R_V, refuses one out of range by its field, and tells the queue’s size only to roles that read the queue', async () => {
    world = await makeWorld();
    const admin = await signIn(world.app, 'admin');
    const created = await admin.agent
      .post('/api/projects')
      .set('X-CSRF-Token', admin.csrf)
      .send({ name: 'Dusty', code: 'DUSTY', site, rV: 5.0, leadEmail: emails.lead })
      .expect(201);
    expect(created.body.project.rV).toBe(5);
    const defaulted = await admin.agent.post('/api/projects').set('X-CSRF-Token', admin.csrf).send({ name: 'Plain', code: 'PLAIN', site }).expect(201);
    expect(defaulted.body.project.rV).toBe(3.1);

    const lead = await signIn(world.app, 'lead');
    const url = `/api/projects/${world.projectId}`;
    for (const rV of [1.5, 7, 'three']) {
      const bad = await lead.agent.patch(url).set('X-CSRF-Token', lead.csrf).send({ rV });
      expect(bad.status).toBe(400);
      expect(bad.body.error.details[0].path).toBe('rV');
    }
    expect((await world.db('projects').where({ id: world.projectId }).first()).r_v).toBe(3.1);

    // Two proposed revisions and one approved (invented rows: the count is what is checked).
    for (const [revision, status] of [[1, 'approved'], [2, 'proposed'], [3, 'proposed']] as const) {
      await world.db('derived_values').insert({
        project_id: world.projectId,
        target_id: world.targetId,
        quantity: 'temperature',
        value: 5000 + revision,
        uncertainty: 50,
        unit: 'K',
        method: 'invented',
        method_label: 'invented for the test',
        inputs_json: '[]',
        constants_json: '[]',
        warnings_json: '[]',
        revision,
        status,
        version: 1,
        depends_on_json: '[]',
        created_at: '2026-11-30T23:00:00.000Z',
      });
    }
    for (const who of ['lead', 'observer', 'reader', 'pi'] as const) {
      const s = await signIn(world.app, who);
      const expected = who === 'lead' || who === 'observer' ? 2 : null;
      expect((await s.agent.get(url).expect(200)).body.project.awaitingReview).toBe(expected);
      const mine = (await s.agent.get('/api/projects').expect(200)).body.projects.find((p: { id: number }) => p.id === world.projectId);
      expect(mine.awaitingReview).toBe(expected);
    }
  });

  it('a changed R_V re-derives every target of the project in the same request, with the setting before and after in the trail', async () => {
    world = await makeWorld();
    const [second] = await world
      .db('targets')
      .insert({ project_id: world.projectId, designation: 'T 2', designation_key: 't2', ra_deg: 2, dec_deg: 2, notes: '', tags: '[]', created_at: '2026-11-30T22:00:00.000Z', updated_at: '2026-11-30T22:00:00.000Z' })
      .returning('id');
    // Invented measurements in SI: a continuum peak, a V magnitude and E(B−V), so the flux from V depends on R_V.
    for (const targetId of [world.targetId, second.id]) {
      for (const [kind, value, sigma, unit, band] of [
        ['peak_wavelength', 5e-7, 5e-9, 'm', null],
        ['magnitude', 8.2, 0.02, 'mag', 'V'],
        ['extinction', 0.3, 0.02, 'mag', null],
      ] as const) {
        await world.db('measurements').insert({
          project_id: world.projectId,
          target_id: targetId,
          kind,
          value_si: value,
          uncertainty_si: sigma,
          unit_si: unit,
          value_as_sent: value,
          band,
          created_at: '2026-11-30T23:00:00.000Z',
        });
      }
    }
    const lead = await signIn(world.app, 'lead');
    const url = `/api/projects/${world.projectId}`;
    const fluxes = () => world.db('derived_values').where({ quantity: 'bolometric_flux' }).orderBy(['target_id', 'revision']);

    await lead.agent.patch(url).set('X-CSRF-Token', lead.csrf).send({ rV: 3.1, name: 'Renamed' }).expect(200);
    expect(await fluxes()).toHaveLength(0);
    await lead.agent.patch(url).set('X-CSRF-Token', lead.csrf).send({ description: 'Dusty field' }).expect(200);


    const res = await lead.agent.patch(url).set('X-CSRF-Token', lead.csrf).send({ rV: 4.0 }).expect(200);
    // What a PATCH leaves out stays as it was.
    expect(res.body.project).toMatchObject({ rV: 4, name: 'Renamed', description: 'Dusty field' });
    const renamed = await lead.agent.patch(url).set('X-CSRF-Token', lead.csrf).send({ name: 'Renamed again' }).expect(200);
    expect(renamed.body.project).toMatchObject({ rV: 4, description: 'Dusty field' });
    const rows = await fluxes();
    expect(rows.map((r: { target_id: number }) => r.target_id)).toEqual([world.targetId, second.id]);
    for (const r of rows) expect(r.method_label).toContain('R_V = 4');

    const entries = await world.db('trail_events').where({ action: 'project.updated' }).orderBy('id');
    expect(entries).toHaveLength(4);
    expect(JSON.parse(entries[0].before_json)).toMatchObject({ name: 'Test programme', rV: 3.1 });
    expect(JSON.parse(entries[0].after_json)).toMatchObject({ name: 'Renamed', rV: 3.1 });
    expect(JSON.parse(entries[2].before_json)).toMatchObject({ name: 'Renamed', description: 'Dusty field', rV: 3.1 });
    expect(JSON.parse(entries[2].after_json)).toMatchObject({ name: 'Renamed', description: 'Dusty field', rV: 4, site: { name: 'Test Site' } });
  });
});
