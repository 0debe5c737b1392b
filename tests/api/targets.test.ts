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
    // A tag is found whatever its case, on either engine (SQLite's LIKE ignores ASCII case, PostgreSQL's does not).
    expect((await agent.get(`${targetsUrl(world)}?tag=ODD`).expect(200)).body.total).toBe(5);
    expect((await agent.get(`${targetsUrl(world)}?q=T1`).expect(200)).body.total).toBe(4);
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

/*
 * The numbers below are invented: these tests check which stored revision
 * the table shows to whom and how it sorts, not the physics that made them.
 */
type Status = 'proposed' | 'approved' | 'rejected' | 'superseded';

async function revision(w: World, targetId: number, quantity: string, rev: number, status: Status, value: number, label: string | null = null) {
  await w.db('derived_values').insert({
    project_id: w.projectId,
    target_id: targetId,
    quantity,
    value,
    uncertainty: value / 100,
    unit: quantity === 'spectral_class' ? '1' : quantity === 'temperature' ? 'K' : 'm',
    label,
    method: 'invented',
    method_label: 'invented for the test',
    inputs_json: '[]',
    constants_json: '[]',
    warnings_json: '[]',
    revision: rev,
    status,
    version: 1,
    depends_on_json: '[]',
    created_at: '2026-11-30T23:00:00.000Z',
  });
}

async function addTarget(w: World, designation: string): Promise<number> {
  const [row] = await w
    .db('targets')
    .insert({
      project_id: w.projectId,
      designation,
      designation_key: designation.replace(/\s+/g, '').toLowerCase(),
      ra_deg: 1,
      dec_deg: 1,
      notes: '',
      tags: '[]',
      created_at: '2026-11-30T22:00:00.000Z',
      updated_at: '2026-11-30T22:00:00.000Z',
    })
    .returning('id');
  return row.id;
}

interface Row {
  id: number;
  designation: string;
  awaitingReview: number;
  values: Record<string, { quantity: string; value: number; status: Status; label: string | null } | undefined>;
}

describe('the target table’s values', () => {
  it('shows a reader the newest approved revision and everyone else the newest approved or proposed one', async () => {
    world = await makeWorld();
    const t = world.targetId;
    await revision(world, t, 'temperature', 1, 'approved', 5000);
    await revision(world, t, 'temperature', 2, 'proposed', 5200);
    await revision(world, t, 'radius', 1, 'approved', 7e8);
    await revision(world, t, 'radius', 2, 'rejected', 9e8);
    await revision(world, t, 'spectral_class', 1, 'superseded', 40, 'G0');
    await revision(world, t, 'spectral_class', 2, 'proposed', 42, 'G2');
    // The parallax distance is preferred where the caller may see one; else the photometric.
    await revision(world, t, 'distance_photometric', 1, 'approved', 3e17);
    await revision(world, t, 'distance_parallax', 1, 'proposed', 3.1e17);

    const reader = await signIn(world.app, 'reader');
    const asReader: Row = (await reader.agent.get(targetsUrl(world)).expect(200)).body.items[0];
    expect(asReader.values.temperature).toMatchObject({ quantity: 'temperature', value: 5000, status: 'approved' });
    expect(asReader.values.radius).toMatchObject({ value: 7e8, status: 'approved' });
    expect(asReader.values.spectral_class).toBeUndefined();
    expect(asReader.values.distance).toMatchObject({ quantity: 'distance_photometric', value: 3e17, status: 'approved' });
    expect(asReader.values.luminosity).toBeUndefined();
    expect(asReader.awaitingReview).toBe(0);

    for (const who of ['lead', 'observer', 'pi'] as const) {
      const s = await signIn(world.app, who);
      const row: Row = (await s.agent.get(targetsUrl(world)).expect(200)).body.items[0];
      expect(row.values.temperature).toMatchObject({ value: 5200, status: 'proposed' });
      // A rejected revision is never the shown one; the approved value before it stays.
      expect(row.values.radius).toMatchObject({ value: 7e8, status: 'approved' });
      expect(row.values.spectral_class).toMatchObject({ value: 42, label: 'G2', status: 'proposed' });
      expect(row.values.distance).toMatchObject({ quantity: 'distance_parallax', status: 'proposed' });
      expect(row.awaitingReview).toBe(3);
    }
  });

  it('sorts by temperature both ways with a missing value last, using the value the caller sees', async () => {
    world = await makeWorld();
    const t1 = world.targetId;
    const t2 = await addTarget(world, 'T 2');
    const t3 = await addTarget(world, 'T 3');
    await addTarget(world, 'T 4');
    await revision(world, t1, 'temperature', 1, 'approved', 5000);
    await revision(world, t2, 'temperature', 1, 'approved', 3000);
    await revision(world, t3, 'temperature', 1, 'approved', 8000);
    await revision(world, t3, 'temperature', 2, 'proposed', 2000);

    const order = async (who: 'reader' | 'lead', dir: 'asc' | 'desc') => {
      const s = await signIn(world.app, who);
      const res = await s.agent.get(`${targetsUrl(world)}?sort=temperature&order=${dir}`).expect(200);
      return res.body.items.map((r: Row) => r.designation);
    };
    expect(await order('reader', 'asc')).toEqual(['T 2', 'T 1', 'T 3', 'T 4']);
    expect(await order('reader', 'desc')).toEqual(['T 3', 'T 1', 'T 2', 'T 4']);
    expect(await order('lead', 'asc')).toEqual(['T 3', 'T 2', 'T 1', 'T 4']);
    expect(await order('lead', 'desc')).toEqual(['T 1', 'T 2', 'T 3', 'T 4']);

    // Paging through a value sort keeps the missing value on the last page.
    const lead = await signIn(world.app, 'lead');
    const last = await lead.agent.get(`${targetsUrl(world)}?sort=temperature&order=desc&page=2&pageSize=3`).expect(200);
    expect(last.body.items.map((r: Row) => r.designation)).toEqual(['T 4']);
    expect(last.body.total).toBe(4);
  });

  it('sorts the spectral class by its numeric index, not its label', async () => {
    world = await makeWorld();
    const t2 = await addTarget(world, 'T 2');
    // Alphabetically "M2" comes before "O2"; by index (O2 = 2, M2 = 62) the hotter O star comes first.
    await revision(world, world.targetId, 'spectral_class', 1, 'approved', 62, 'M2');
    await revision(world, t2, 'spectral_class', 1, 'approved', 2, 'O2');
    const reader = await signIn(world.app, 'reader');
    const res = await reader.agent.get(`${targetsUrl(world)}?sort=spectral_class&order=asc`).expect(200);
    expect(res.body.items.map((r: Row) => r.values.spectral_class?.label)).toEqual(['O2', 'M2']);
  });

  it('filters to targets awaiting review; a reader, who is not shown proposals, gets none', async () => {
    world = await makeWorld();
    const t2 = await addTarget(world, 'T 2');
    await addTarget(world, 'T 3');
    await revision(world, world.targetId, 'temperature', 1, 'approved', 5000);
    await revision(world, t2, 'temperature', 1, 'proposed', 6000);
    await revision(world, t2, 'luminosity', 1, 'proposed', 4e26);

    const lead = await signIn(world.app, 'lead');
    const awaiting = await lead.agent.get(`${targetsUrl(world)}?awaiting=true`).expect(200);
    expect(awaiting.body.total).toBe(1);
    expect(awaiting.body.items.map((r: Row) => [r.designation, r.awaitingReview])).toEqual([['T 2', 2]]);
    const all = await lead.agent.get(`${targetsUrl(world)}?awaiting=false`).expect(200);
    expect(all.body.total).toBe(3);

    const reader = await signIn(world.app, 'reader');
    const none = await reader.agent.get(`${targetsUrl(world)}?awaiting=true`).expect(200);
    expect(none.body).toMatchObject({ items: [], total: 0 });

    const bad = await lead.agent.get(`${targetsUrl(world)}?awaiting=yes`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('awaiting');
  });
});

/** Measurements in SI, straight into the table, so a re-derivation has something to derive from (invented numbers). */
async function measure(w: World, targetId: number, kind: string, valueSi: number, sigmaSi: number, unitSi: string, band: string | null = null) {
  await w.db('measurements').insert({
    project_id: w.projectId,
    target_id: targetId,
    kind,
    value_si: valueSi,
    uncertainty_si: sigmaSi,
    unit_si: unitSi,
    value_as_sent: valueSi,
    band,
    created_at: '2026-11-30T23:00:00.000Z',
  });
}

describe('the assumed luminosity class', () => {
  it('an edit that leaves out tags or the class keeps them', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const created = await agent
      .post(targetsUrl(world))
      .set('X-CSRF-Token', csrf)
      .send({ designation: 'Kept 1', ra: 1, dec: 1, tags: ['dwarf', 'priority'], assumedClass: 'subgiant' })
      .expect(201);
    const url = `${targetsUrl(world)}/${created.body.target.id}`;
    const edited = await agent.patch(url).set('X-CSRF-Token', csrf).send({ notes: 'seen again' }).expect(200);
    expect(edited.body.target).toMatchObject({ notes: 'seen again', tags: ['dwarf', 'priority'], assumedClass: 'subgiant' });
  });


  it('round-trips, defaults to the main sequence, and is refused by name when unknown', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const plain = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: 'AC 1', ra: 1, dec: 1 }).expect(201);
    expect(plain.body.target.assumedClass).toBe('main_sequence');
    const giant = await agent
      .post(targetsUrl(world))
      .set('X-CSRF-Token', csrf)
      .send({ designation: 'AC 2', ra: 2, dec: 2, assumedClass: 'giant' })
      .expect(201);
    expect(giant.body.target.assumedClass).toBe('giant');
    const url = `${targetsUrl(world)}/${giant.body.target.id}`;
    await agent.patch(url).set('X-CSRF-Token', csrf).send({ assumedClass: 'supergiant' }).expect(200);
    expect((await agent.get(url).expect(200)).body.target.assumedClass).toBe('supergiant');

    const bad = await agent.patch(url).set('X-CSRF-Token', csrf).send({ assumedClass: 'dwarf' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('assumedClass');
    expect((await world.db('targets').where({ id: giant.body.target.id }).first()).assumed_class).toBe('supergiant');
  });

  it('a changed class re-derives the target in the same request; an unchanged one does not', async () => {
    world = await makeWorld();
    const t = world.targetId;
    // A continuum peak at 500 nm and a bolometric flux: enough for the spectroscopic-parallax route.
    await measure(world, t, 'peak_wavelength', 5e-7, 5e-9, 'm');
    await measure(world, t, 'bolometric_flux', 1e-10, 1e-12, 'W/m2');
    const { agent, csrf } = await signIn(world.app, 'lead');
    const url = `${targetsUrl(world)}/${t}`;
    const count = async () => Number((await world.db('derived_values').where({ target_id: t }).count('* as n').first())?.n);

    await agent.patch(url).set('X-CSRF-Token', csrf).send({ assumedClass: 'main_sequence', notes: 'unchanged class' }).expect(200);
    expect(await count()).toBe(0);

    await agent.patch(url).set('X-CSRF-Token', csrf).send({ assumedClass: 'giant' }).expect(200);
    const first = await world.db('derived_values').where({ target_id: t, quantity: 'distance_photometric' });
    expect(first).toHaveLength(1);

    await agent.patch(url).set('X-CSRF-Token', csrf).send({ assumedClass: 'main_sequence' }).expect(200);
    const revisions = await world.db('derived_values').where({ target_id: t, quantity: 'distance_photometric' }).orderBy('revision');
    // A main-sequence star of the same temperature and flux is fainter than a giant, hence nearer.
    expect(revisions.map((r: { status: string }) => r.status)).toEqual(['superseded', 'proposed']);
    expect(revisions[1].value).toBeLessThan(revisions[0].value);
  });
});
