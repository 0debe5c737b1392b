import { afterEach, describe, expect, it } from 'vitest';
import type { HrDiagram } from '../../shared/schemas/hr';
import { makeWorld, signIn, type World } from '../support/world';

/**
 * The HR diagram's feed: one entry per target with both a temperature and a
 * luminosity; readers see approved values only (PRODUCT.md, "People and
 * roles"), others may ask for the newest proposals. Values are written
 * straight into the table: what is checked is which revision is served.
 * The Sun's numbers (T_eff = 5772 K, L☉ = 3.828e26 W: IAU 2015 Resolution B3)
 * stand in for an approved star.
 */
let world: World;
afterEach(async () => world?.db.destroy());

const L_SUN_W = 3.828e26;

async function put(w: World, targetId: number, quantity: string, revision: number, value: number, status: string, label: string | null = null) {
  await w.db('derived_values').insert({
    project_id: w.projectId,
    target_id: targetId,
    quantity,
    value,
    uncertainty: value * 0.02,
    unit: quantity === 'temperature' ? 'K' : quantity === 'luminosity' ? 'W' : 'dex',
    label,
    method: 'test',
    method_label: 'test',
    inputs_json: '[]',
    constants_json: '[]',
    warnings_json: '[]',
    revision,
    status,
    created_at: '2026-12-01T00:00:00.000Z',
  });
}

async function seed(w: World) {
  await w.db('targets').where({ id: w.targetId }).update({ tags: JSON.stringify(['standard']) });
  await put(w, w.targetId, 'temperature', 1, 5772, 'approved');
  await put(w, w.targetId, 'luminosity', 1, L_SUN_W, 'approved');
  await put(w, w.targetId, 'luminosity_class', 1, 0, 'approved', 'main sequence (V)');
  // A newer temperature awaiting review, and a rejected one that must never show.
  await put(w, w.targetId, 'temperature', 2, 5900, 'rejected');
  await put(w, w.targetId, 'temperature', 3, 5800, 'proposed');
  // A second target with a temperature only: not on the diagram.
  const [t2] = await w.db('targets')
    .insert({ project_id: w.projectId, designation: 'T 2', designation_key: 't2', ra_deg: 1, dec_deg: 1, notes: '', tags: '[]', created_at: '2026-12-01T00:00:00.000Z', updated_at: '2026-12-01T00:00:00.000Z' })
    .returning('id');
  await put(w, t2.id, 'temperature', 1, 4000, 'approved');
}

describe('GET /projects/:projectId/hr', () => {
  it('gives a reader the approved values only, even when asking for proposals', async () => {
    world = await makeWorld();
    await seed(world);
    const s = await signIn(world.app, 'reader');
    const res = await s.agent.get(`/api/projects/${world.projectId}/hr?include=proposed`).expect(200);
    const body = res.body as HrDiagram;
    expect(body.include).toBe('approved');
    expect(body.stars).toEqual([
      {
        id: world.targetId,
        designation: 'T 1',
        tags: ['standard'],
        temperature: { value: 5772, sigma: 5772 * 0.02, status: 'approved' },
        luminosity: { value: L_SUN_W, sigma: L_SUN_W * 0.02, status: 'approved' },
        luminosityClass: 'main sequence (V)',
      },
    ]);
  });

  it('gives the lead the newest proposal with include=proposed, and approved values by default', async () => {
    world = await makeWorld();
    await seed(world);
    const s = await signIn(world.app, 'lead');
    const proposed = (await s.agent.get(`/api/projects/${world.projectId}/hr?include=proposed`).expect(200)).body as HrDiagram;
    expect(proposed.include).toBe('proposed');
    expect(proposed.stars).toHaveLength(1);
    expect(proposed.stars[0].temperature).toEqual({ value: 5800, sigma: 5800 * 0.02, status: 'proposed' });
    expect(proposed.stars[0].luminosity.status).toBe('approved');
    const approved = (await s.agent.get(`/api/projects/${world.projectId}/hr`).expect(200)).body as HrDiagram;
    expect(approved.stars[0].temperature.value).toBe(5772);
  });

  it('answers 404 to someone outside the project and 400 to an unknown include', async () => {
    world = await makeWorld();
    await seed(world);
    const outsider = await signIn(world.app, 'outsider');
    await outsider.agent.get(`/api/projects/${world.projectId}/hr`).expect(404);
    const lead = await signIn(world.app, 'lead');
    await lead.agent.get(`/api/projects/${world.projectId}/hr?include=everything`).expect(400);
  });
});
