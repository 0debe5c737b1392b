import { afterEach, describe, expect, it } from 'vitest';
import type { DerivedValue, QueueItem } from '../../shared/schemas/derived';
import { hashPassword } from '../../server/lib/passwords';
import { makeWorld, PASSWORD, signIn, type Session, type World } from '../support/world';
import { commitFile, NIGHT, newestDerived } from '../support/night';

/**
 * The lead's sign-off: statuses and revisions, approval of upstream values,
 * versions and the race between two reviewers, re-runs, and the trail each
 * decision leaves. The measurements are the demo kind of night (invented
 * numbers); what is checked is the review rules, not the physics.
 */
let world: World;
afterEach(async () => world?.db.destroy());




const review = (s: Session, w: World, body: object) => s.agent.post(`/api/projects/${w.projectId}/review`).set('X-CSRF-Token', s.csrf).send(body);
const item = (d: DerivedValue) => ({ id: d.id, version: d.version });

async function trailActions(w: World): Promise<{ action: string; entity_id: number | null; target_id: number | null; note: string }[]> {
  return w.db('trail_events').where({ project_id: w.projectId }).orderBy('id').select('action', 'entity_id', 'target_id', 'note');
}

describe('approving and rejecting derived values', () => {
  it('approves a value together with the proposed upstream values it was computed from, in one transaction', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await commitFile(lead, world, NIGHT);
    const before = await newestDerived(lead, world);
    expect(before.luminosity.status).toBe('proposed');
    expect(before.luminosity.dependsOn).toEqual(expect.arrayContaining(['bolometric_flux', 'distance_parallax']));

    const queue = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?quantity=luminosity`).expect(200);
    const luminosityItem = queue.body.items[0] as QueueItem;
    expect(luminosityItem.target.designation).toBe('T 1');
    const upstreamQuantities = luminosityItem.upstream.map((u) => u.quantity).sort();
    expect(upstreamQuantities).toEqual(expect.arrayContaining(['bolometric_flux', 'distance_parallax', 'temperature']));
    expect(luminosityItem.provenance.map((p) => p.rowNumber).sort()).toEqual([2, 3, 4, 5]);
    expect(luminosityItem.provenance[0].uploadFilename).toBe('night.csv');

    const res = await review(lead, world, { decision: 'approve', note: 'Checked against the night log.', items: [item(before.luminosity)] }).expect(200);
    const decided = (res.body.decided as DerivedValue[]).map((d) => d.quantity).sort();
    expect(decided).toEqual(['luminosity', ...upstreamQuantities].sort());
    for (const d of res.body.decided as DerivedValue[]) {
      expect(d.status).toBe('approved');
      expect(d.reviewer).toBe('Test lead');
      expect(d.version).toBe(2);
    }

    // A reader sees exactly the approved values.
    const reader = await signIn(world.app, 'reader');
    const seen = await newestDerived(reader, world);
    expect(Object.keys(seen).sort()).toEqual(decided);

    const approvals = (await trailActions(world)).filter((e) => e.action === 'value.approved');
    expect(approvals).toHaveLength(decided.length);
    expect(approvals.every((e) => e.note === 'Checked against the night log.' && e.target_id === world.targetId)).toBe(true);
  });

  it('rejects with a note only, keeps the rejection in the history, and refuses to approve what rests on it', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await commitFile(lead, world, NIGHT);
    const v = await newestDerived(lead, world);

    const noNote = await review(lead, world, { decision: 'reject', items: [item(v.temperature)] }).expect(400);
    expect(noNote.body.error.details).toEqual([expect.objectContaining({ path: 'note' })]);

    await review(lead, world, { decision: 'reject', note: 'Peak wavelength is from a saturated frame.', items: [item(v.temperature)] }).expect(200);
    const refused = await review(lead, world, { decision: 'approve', items: [item(v.radius)] }).expect(409);
    expect(refused.body.error.code).toBe('upstream_not_approvable');
    expect(refused.body.error.message).toMatch(/temperature revision 1, which is rejected/);
    expect((await newestDerived(lead, world)).radius.status).toBe('proposed');

    const history = await lead.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived?include=all`).expect(200);
    const temperature = (history.body.derived as DerivedValue[]).find((d) => d.quantity === 'temperature')!;
    expect(temperature).toMatchObject({ status: 'rejected', reviewNote: 'Peak wavelength is from a saturated frame.', reviewer: 'Test lead' });

    // A re-run with nothing new does not propose the rejected value again.
    const rerun = await lead.agent.post(`/api/projects/${world.projectId}/rederive`).set('X-CSRF-Token', lead.csrf).send({ targetId: world.targetId }).expect(200);
    expect(rerun.body).toEqual({ targets: 1, proposed: 0 });
  });

  it('supersedes an approved value only when its successor is approved', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await commitFile(lead, world, NIGHT);
    const first = await newestDerived(lead, world);
    await review(lead, world, { decision: 'approve', items: [item(first.distance_parallax)] }).expect(200);

    await commitFile(lead, world, 'target,quantity,value,uncertainty,unit\nT 1,parallax,40.8,0.3,mas\n');
    const history = async () =>
      ((await lead.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived?include=all`).expect(200)).body.derived as DerivedValue[]).filter(
        (d) => d.quantity === 'distance_parallax',
      );
    const [second, old] = await history();
    expect([second.revision, second.status, old.revision, old.status]).toEqual([2, 'proposed', 1, 'approved']);

    const reader = await signIn(world.app, 'reader');
    expect((await newestDerived(reader, world)).distance_parallax.revision).toBe(1);

    const res = await review(lead, world, { decision: 'approve', items: [item(second)] }).expect(200);
    expect(res.body.superseded).toEqual([old.id]);
    const [now, then] = await history();
    expect([now.status, then.status]).toEqual(['approved', 'superseded']);
    expect((await newestDerived(reader, world)).distance_parallax.revision).toBe(2);
  });
});

describe('versions: a decision on a value that changed since it was seen', () => {
  it('answers 409 stale_value with what the value is now, and changes nothing', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await commitFile(lead, world, NIGHT);
    const seen = await newestDerived(lead, world);
    // A new parallax arrives: distance_parallax revision 1 is superseded by revision 2.
    await commitFile(lead, world, 'target,quantity,value,uncertainty,unit\nT 1,parallax,40.8,0.3,mas\n');

    const res = await review(lead, world, { decision: 'approve', items: [item(seen.distance_parallax), item(seen.temperature)] }).expect(409);
    expect(res.body.error.code).toBe('stale_value');
    expect(res.body.error.details).toEqual([
      expect.objectContaining({ id: seen.distance_parallax.id, seenVersion: 1, current: expect.objectContaining({ revision: 2, status: 'proposed' }) }),
    ]);
    expect(res.body.error.message).toMatch(/revision 1 is now superseded; the newest is revision 2/);
    // All or nothing: the temperature, which had not changed, was not approved either.
    expect((await newestDerived(lead, world)).temperature.status).toBe('proposed');

    const wrongVersion = await review(lead, world, { decision: 'reject', note: 'x', items: [{ id: seen.temperature.id, version: 7 }] }).expect(409);
    expect(wrongVersion.body.error.code).toBe('stale_value');
  });

  it('lets exactly one of two leads win when both decide on the same value at once', async () => {
    world = await makeWorld();
    const hash = await hashPassword(PASSWORD);
    const at = '2026-12-01T00:00:00.000Z';
    const [second] = await world.db('users').insert({ email: 'lead2@test.invalid', name: 'Second lead', password_hash: hash, is_site_admin: false, created_at: at, updated_at: at }).returning('id');
    await world.db('project_members').insert({ project_id: world.projectId, user_id: second.id, role: 'lead', added_at: at });
    const lead = await signIn(world.app, 'lead');
    const other = await signInAs(world, 'lead2@test.invalid');
    await commitFile(lead, world, NIGHT);
    const v = await newestDerived(lead, world);

    // Values with no upstream, so each race is about exactly one row.
    for (const quantity of ['temperature_wien', 'temperature_colour', 'distance_parallax']) {
      const target = v[quantity];
      expect(target.status).toBe('proposed');
      const [a, b] = await Promise.all([
        review(lead, world, { decision: 'approve', items: [item(target)] }),
        review(other, world, { decision: 'reject', note: 'Not this one.', items: [item(target)] }),
      ]);
      expect([a.status, b.status].sort()).toEqual([200, 409]);
      const loser = a.status === 409 ? a : b;
      expect(loser.body.error.code).toBe('stale_value');
      const decisions = (await trailActions(world)).filter((e) => e.entity_id === target.id && (e.action === 'value.approved' || e.action === 'value.rejected'));
      expect(decisions).toHaveLength(1);
    }
  });
});

describe('re-running derivations', () => {
  it('proposes only what a changed setting touches, in one run with one trail entry', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    await commitFile(observer, world, NIGHT + '\nT 1,extinction,0.10,0.02,mag,');
    const unchanged = await observer.agent.post(`/api/projects/${world.projectId}/rederive`).set('X-CSRF-Token', observer.csrf).send({}).expect(200);
    expect(unchanged.body).toEqual({ targets: 1, proposed: 0 });

    // R_V feeds A_V = R_V E(B−V), hence the bolometric flux and all that rests on it; the colour temperature does not use it.
    await world.db('projects').where({ id: world.projectId }).update({ r_v: 3.6 });
    const before = await newestDerived(observer, world);
    const rerun = await observer.agent.post(`/api/projects/${world.projectId}/rederive`).set('X-CSRF-Token', observer.csrf).send({}).expect(200);
    expect(rerun.body.proposed).toBeGreaterThan(0);
    const after = await newestDerived(observer, world);
    expect(after.bolometric_flux.revision).toBe(before.bolometric_flux.revision + 1);
    expect(after.luminosity.revision).toBe(before.luminosity.revision + 1);
    expect(after.temperature_colour.revision).toBe(before.temperature_colour.revision);
    expect(after.distance_parallax.revision).toBe(before.distance_parallax.revision);

    const actions = await trailActions(world);
    expect(actions.filter((e) => e.action === 'derivations.rerun')).toHaveLength(2);
    const supersededNow = actions.filter((e) => e.action === 'value.superseded');
    expect(supersededNow.map((e) => e.entity_id)).toContain(before.bolometric_flux.id);
    expect(actions.filter((e) => e.action === 'value.proposed' && e.entity_id === after.bolometric_flux.id)).toHaveLength(1);
  });

  it('is refused to readers and the PI, and the queue is not shown to them', async () => {
    world = await makeWorld();
    for (const who of ['reader', 'pi'] as const) {
      const s = await signIn(world.app, who);
      await s.agent.post(`/api/projects/${world.projectId}/rederive`).set('X-CSRF-Token', s.csrf).send({}).expect(403);
      await s.agent.get(`/api/projects/${world.projectId}/review-queue`).expect(403);
    }
  });
});

describe('the review queue', () => {
  it('pages proposed values by target, filters by warnings, and shows the approved value each would replace', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await commitFile(lead, world, NIGHT);
    const all = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?pageSize=3`).expect(200);
    expect(all.body.items).toHaveLength(3);
    const total = all.body.total as number;
    const page2 = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?pageSize=3&page=2`).expect(200);
    expect(page2.body.items[0].proposed.id).not.toBe(all.body.items[0].proposed.id);
    // Table order: the Wien temperature before the adopted one, before what rests on it.
    const order = all.body.items.map((i: QueueItem) => i.proposed.quantity);
    expect(order.indexOf('temperature_wien')).toBeLessThan(order.indexOf('temperature') === -1 ? 99 : order.indexOf('temperature'));

    const withW = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?warnings=with&pageSize=200`).expect(200);
    const without = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?warnings=without&pageSize=200`).expect(200);
    expect(withW.body.total + without.body.total).toBe(total);
    expect((withW.body.items as QueueItem[]).every((i) => i.proposed.warnings.length > 0)).toBe(true);
    expect((without.body.items as QueueItem[]).every((i) => i.proposed.warnings.length === 0)).toBe(true);

    const v = await newestDerived(lead, world);
    await review(lead, world, { decision: 'approve', items: [item(v.distance_parallax)] }).expect(200);
    await commitFile(lead, world, 'target,quantity,value,uncertainty,unit\nT 1,parallax,40.8,0.3,mas\n');
    const replaced = await lead.agent.get(`/api/projects/${world.projectId}/review-queue?quantity=distance_parallax`).expect(200);
    expect(replaced.body.items[0].approved).toMatchObject({ revision: 1, status: 'approved' });
    expect(replaced.body.items[0].proposed).toMatchObject({ revision: 2, status: 'proposed' });
  });
});

async function signInAs(w: World, email: string): Promise<Session> {
  const { default: request } = await import('supertest');
  const agent = request.agent(w.app);
  const res = await agent.post('/api/auth/login').send({ email, password: PASSWORD }).expect(200);
  return { agent, csrf: res.body.csrfToken };
}
