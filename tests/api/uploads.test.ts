import { afterEach, describe, expect, it } from 'vitest';
import { planckSpectralRadiance } from '../../shared/physics/planck';
import { makeWorld, signIn, type Session, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const HEADER = 'target,ra,dec,quantity,value,uncertainty,unit,band,rest_wavelength,observed_at,note';

async function upload(s: Session, w: World, content: string | Buffer, fields: Record<string, string> = {}, projectId = w.projectId) {
  let req = s.agent.post(`/api/projects/${projectId}/uploads`).set('X-CSRF-Token', s.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), 'night.csv');
}

const commit = (s: Session, w: World, id: number, body: object = {}, projectId = w.projectId) =>
  s.agent.post(`/api/projects/${projectId}/uploads/${id}/commit`).set('X-CSRF-Token', s.csrf).send(body);

async function countRows(w: World, table: string) {
  const row = await w.db(table).count<{ n: number }>('* as n').first();
  return Number(row!.n);
}

describe('measurement uploads: the happy path', () => {
  it('previews a long file, commits it whole, creates the new target and proposes derived values', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = [
      HEADER,
      'GW 9,05 14 32.3,-08 12 05,colour_index,0.65,0.02,mag,B-V,,2026-11-30T22:14:05Z,',
      'GW 9,,,magnitude,7.42,0.02,mag,V,,2026-11-30T22:14:05Z,',
      'GW 9,,,parallax,41.2,0.4,mas,,,,catalogue',
      'gw9,,,peak_wavelength,502,5,nm,,,2026-11-30T22:20:00Z,',
      't 1,,,line_wavelength,656.301,0.004,nm,,656.279,2026-11-30T23:02:11Z,H-alpha',
    ].join('\n');
    const res = await upload(s, world, file);
    expect(res.status).toBe(201);
    const up = res.body.upload;
    expect(up.status).toBe('previewed');
    expect(up.errors).toEqual([]);
    expect(up.measurementCount).toBe(5);
    expect(up.newTargets).toEqual(['GW 9']);
    expect(await countRows(world, 'measurements')).toBe(0);

    const done = await commit(s, world, up.id).expect(200);
    expect(done.body.measurementsAdded).toBe(5);
    expect(done.body.targetsCreated).toEqual(['GW 9']);
    expect(done.body.targets.map((t: { designation: string }) => t.designation)).toEqual(['GW 9', 'T 1']);
    const reopened = await s.agent.get(`/api/projects/${world.projectId}/uploads/${up.id}`).expect(200);
    expect(reopened.body.upload.targets).toEqual(done.body.targets);
    expect(done.body.derivedProposed).toBeGreaterThan(5);

    const targets = await s.agent.get(`/api/projects/${world.projectId}/targets?q=gw9`).expect(200);
    const gw9 = targets.body.items[0];
    const derived = await s.agent.get(`/api/projects/${world.projectId}/targets/${gw9.id}/derived`).expect(200);
    const byQuantity = Object.fromEntries(derived.body.derived.map((d: { quantity: string }) => [d.quantity, d]));
    for (const q of ['temperature_wien', 'temperature_colour', 'temperature', 'distance_parallax', 'luminosity', 'radius', 'spectral_class']) {
      expect(byQuantity[q], q).toBeDefined();
      expect(byQuantity[q].status).toBe('proposed');
      expect(byQuantity[q].revision).toBe(1);
    }
    // d = 1000 / 41.2 mas pc (trigonometric parallax, REFERENCES.md); 1 pc = 3.085677581491367e16 m (IAU 2015 B2).
    expect(byQuantity.distance_parallax.value).toBeCloseTo((1000 / 41.2) * 3.085677581491367e16, -12);
    const measurements = await s.agent.get(`/api/projects/${world.projectId}/targets/${gw9.id}/measurements`).expect(200);
    expect(measurements.body.measurements.every((m: { uploadId: number }) => m.uploadId === up.id)).toBe(true);
    expect(measurements.body.measurements.map((m: { rowNumber: number }) => m.rowNumber).sort()).toEqual([2, 3, 4, 5]);
    const halpha = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived`).expect(200);
    expect(halpha.body.derived.map((d: { quantity: string }) => d.quantity)).toContain('radial_velocity');
  });

  it('shows readers only approved values; proposed ones stay with the team', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const up = await upload(s, world, 'target,quantity,value,uncertainty,unit\nT 1,parallax,20,0.5,mas\n');
    await commit(s, world, up.body.upload.id).expect(200);
    const url = `/api/projects/${world.projectId}/targets/${world.targetId}/derived`;
    expect((await s.agent.get(url).expect(200)).body.derived).toHaveLength(1);
    const reader = await signIn(world.app, 'reader');
    expect((await reader.agent.get(url).expect(200)).body.derived).toEqual([]);
    await world.db('derived_values').update({ status: 'approved' });
    expect((await reader.agent.get(url).expect(200)).body.derived).toHaveLength(1);
  });

  it('a second upload of new data proposes a new revision and supersedes the unreviewed one', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'lead');
    const first = await upload(s, world, `target,quantity,value,uncertainty,unit\nT 1,parallax,20,0.5,mas\n`);
    await commit(s, world, first.body.upload.id).expect(200);
    const second = await upload(s, world, `target,quantity,value,uncertainty,unit\nT 1,parallax,21,0.3,mas\n`);
    await commit(s, world, second.body.upload.id).expect(200);
    const all = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived?include=all`).expect(200);
    const distances = all.body.derived.filter((d: { quantity: string }) => d.quantity === 'distance_parallax');
    expect(distances.map((d: { revision: number; status: string }) => [d.revision, d.status])).toEqual([
      [2, 'proposed'],
      [1, 'superseded'],
    ]);
  });

  it('reads semicolons, a byte-order mark and CRLF line ends', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const text = '\uFEFFtarget;quantity;value;unit;band\r\nT 1;parallax;12.5;mas;\r\nT 1;magnitude;8.1;mag;V\r\n';
    const res = await upload(s, world, text);
    expect(res.status).toBe(201);
    expect(res.body.upload.errors).toEqual([]);
    expect(res.body.upload.headers).toEqual(['target', 'quantity', 'value', 'unit', 'band']);
  });

  it('reads UTF-16 with its byte-order mark, as spreadsheets save "Unicode text"', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const text = 'target\tquantity\tvalue\tunit\r\nT 1\tparallax\t12.5\tmas\r\n';
    const res = await upload(s, world, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    expect(res.status).toBe(201);
    expect(res.body.upload.errors).toEqual([]);
    expect(res.body.upload.measurementCount).toBe(1);
  });

  it('reads a wide file through the suggested mapping, with uncertainties from their own columns', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = 'target,observed_at,V,V_err,B_V,E_B_V,parallax_mas,parallax_mas_err\nT 1,2026-11-30T22:00:00Z,7.4,0.02,0.65,0.03,41.2,0.4\n';
    const res = await upload(s, world, file);
    expect(res.body.upload.errors).toEqual([]);
    expect(res.body.upload.mapping.layout).toBe('wide');
    expect(res.body.upload.mapping.columns.E_B_V).toEqual({ role: 'measurement', quantity: 'extinction', unit: 'mag' });
    expect(res.body.upload.measurementCount).toBe(4);
    await commit(s, world, res.body.upload.id).expect(200);
    const m = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/measurements`).expect(200);
    const v = m.body.measurements.find((x: { kind: string }) => x.kind === 'magnitude');
    expect([v.band, v.valueAsSent, v.uncertaintyAsSent]).toEqual(['V', 7.4, 0.02]);
  });

  it('remembers a changed mapping for the next file of the same shape', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = 'star,plx\nT 1,12.5\n';
    const first = await upload(s, world, file);
    const mapping = { layout: 'wide', columns: { star: { role: 'field', field: 'target' }, plx: { role: 'measurement', quantity: 'parallax', unit: 'mas' } } };
    const remapped = await s.agent
      .post(`/api/projects/${world.projectId}/uploads/${first.body.upload.id}/mapping`)
      .set('X-CSRF-Token', s.csrf)
      .send({ mapping })
      .expect(200);
    expect(remapped.body.upload.errors).toEqual([]);
    await commit(s, world, first.body.upload.id).expect(200);
    const next = await upload(s, world, 'star,plx\nT 1,13.1\n');
    expect(next.body.upload.mapping).toEqual(mapping);
  });

  it('keeps the file byte for byte with its SHA-256 and lets members download it', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const bytes = Buffer.from('target,quantity,value,unit\r\nT 1,parallax,12.5,mas\r\n');
    const res = await upload(s, world, bytes);
    const { createHash } = await import('node:crypto');
    expect(res.body.upload.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    const reader = await signIn(world.app, 'reader');
    const raw = await reader.agent.get(`/api/projects/${world.projectId}/uploads/${res.body.upload.id}/file`).buffer(true).parse((r, cb) => {
      const parts: Buffer[] = [];
      r.on('data', (c: Buffer) => parts.push(c));
      r.on('end', () => cb(null, Buffer.concat(parts)));
    });
    expect(raw.status).toBe(200);
    expect(Buffer.compare(raw.body, bytes)).toBe(0);
    expect(raw.headers['content-type']).toBe('application/octet-stream');
  });

  it('fits a Planck curve to a spectrum and records the temperature and peak as measurements', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const rows = ['wavelength_nm,flux'];
    // A 5800 K blackbody sampled 300–1500 nm; its Wien peak is 2.897771955e-3 / 5800 m ≈ 499.6 nm (CODATA 2018 b).
    for (let nm = 300; nm <= 1500; nm += 10) rows.push(`${nm},${(planckSpectralRadiance(nm * 1e-9, 5800) * 1e-20).toPrecision(8)}`);
    const res = await upload(s, world, rows.join('\n'), { kind: 'spectrum', targetId: String(world.targetId) });
    expect(res.status).toBe(201);
    expect(res.body.upload.errors).toEqual([]);
    expect(res.body.upload.spectrum.fit.temperatureK).toBeCloseTo(5800, 0);
    expect(res.body.upload.spectrum.fit.peakWavelengthM * 1e9).toBeCloseTo(499.6, -1);
    await commit(s, world, res.body.upload.id).expect(200);
    const m = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/measurements`).expect(200);
    expect(m.body.measurements.map((x: { kind: string }) => x.kind).sort()).toEqual(['peak_wavelength', 'planck_temperature']);
    const d = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/derived`).expect(200);
    expect(d.body.derived.map((x: { quantity: string }) => x.quantity)).toEqual(expect.arrayContaining(['temperature_planck', 'temperature_wien', 'temperature']));
    const spectra = await s.agent.get(`/api/projects/${world.projectId}/targets/${world.targetId}/spectra`).expect(200);
    expect(spectra.body.spectra).toHaveLength(1);
    expect(spectra.body.spectra[0].points).toHaveLength(121);
    expect(spectra.body.spectra[0].fit.weighted).toBe(false);
  });
});

describe('measurement uploads: bad input', () => {
  const expectRowError = (up: { errors: { row: number; column: string; message: string }[] }, row: number, column: string, message: RegExp) =>
    expect(up.errors).toContainEqual({ row, column, message: expect.stringMatching(message) });

  it.each([
    ['an empty file', '', /empty/],
    ['a header only', 'target,quantity,value,unit\n', /no data rows/],
  ])('refuses %s with a message', async (_what, content, message) => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await upload(s, world, content);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toEqual({ path: 'file', message: expect.stringMatching(message) });
    expect(await countRows(world, 'uploads')).toBe(0);
  });

  it('refuses a binary file renamed .csv', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52]);
    const res = await upload(s, world, png);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].message).toMatch(/not a text CSV/);
  });

  it('refuses a 30 MB file with 413 and a clear message', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const big = Buffer.alloc(30 * 1024 * 1024, 'a');
    const res = await upload(s, world, big);
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/larger than 20 MB/);
  });

  it('names row and column for every bad cell, all at once, and imports nothing', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = [
      HEADER,
      'T 1,,,temperature,5000,,K,,,,', // row 2: unknown quantity
      'T 1,,,parallax,"12,5",,mas,,,,', // row 3: decimal comma
      'T 1,,,parallax,12.5,-0.1,mas,,,,', // row 4: negative uncertainty
      'T 1,,,parallax,12.5,0.1,nm,,,,', // row 5: unit not allowed
      'New 1,25 00 00,+10 00 00,parallax,12.5,0.1,mas,,,,', // row 6: RA 25h
      'New 2,10 00 00,+95 00 00,parallax,12.5,0.1,mas,,,,', // row 7: Dec +95°
      'T 1,,,magnitude,8.0,0.01,mag,V,,,', // row 8: fine
      'T 1,,,magnitude,8.0,0.01,mag,V,,,', // row 9: duplicate of row 8
      'T 1,,,magnitude,8.0,0.01,mag,,,,', // row 10: missing band
      'T 1,,,peak_wavelength,-500,,nm,,,,', // row 11: non-positive wavelength
      'T 1,,,magnitude,8.0,,mag,B,,yesterday,', // row 12: not ISO 8601
    ].join('\n');
    const res = await upload(s, world, file);
    expect(res.status).toBe(201);
    const up = res.body.upload;
    expectRowError(up, 2, 'quantity', /Unknown quantity "temperature"/);
    expectRowError(up, 3, 'value', /decimal comma.*12\.5/);
    expectRowError(up, 4, 'uncertainty', /0 or more/);
    expectRowError(up, 5, 'unit', /not allowed for parallax/);
    expectRowError(up, 6, 'ra', /hours must be 0–23/);
    expectRowError(up, 7, 'dec', /between −90° and \+90°/);
    expectRowError(up, 9, 'value', /repeats row 8/);
    expectRowError(up, 10, 'band', /needs its band/);
    expectRowError(up, 11, 'value', /must be positive/);
    expectRowError(up, 12, 'observed_at', /ISO 8601/);
    expect(up.errors.every((e: { row: number }) => e.row !== 8)).toBe(true);

    const c = await commit(s, world, up.id);
    expect(c.status).toBe(422);
    expect(c.body.error.message).toMatch(/Nothing was imported/);
    expect(await countRows(world, 'measurements')).toBe(0);
    expect(await countRows(world, 'derived_values')).toBe(0);
    expect(await world.db('targets').whereIn('designation', ['New 1', 'New 2'])).toHaveLength(0);

    const page = await s.agent.get(`/api/projects/${world.projectId}/uploads/${up.id}/rows?onlyErrors=true`).expect(200);
    expect(page.body.rows.map((r: { row: number }) => r.row)).toEqual([2, 3, 4, 5, 6, 7, 9, 10, 11, 12]);
    expect(page.body.rows[1].cells[4]).toBe('12,5');
  });

  it('refuses a band or an instrument longer than the database keeps, on its row and field', async () => {
    // The measurements table holds a band of 16 characters and an instrument of 120 (migrations/20261201010000_measurements.ts); PostgreSQL refuses longer, SQLite would keep it.
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = ['target,quantity,value,unit,band,instrument', `T 1,magnitude,8.0,mag,${'V'.repeat(17)},`, `T 1,magnitude,8.0,mag,V,${'x'.repeat(121)}`, `T 1,magnitude,8.0,mag,${'V'.repeat(16)},${'x'.repeat(120)}`].join('\n');
    const res = await upload(s, world, file);
    expect(res.status).toBe(201);
    const up = res.body.upload;
    expectRowError(up, 2, 'band', /at most 16 characters/);
    expectRowError(up, 3, 'instrument', /at most 120 characters/);
    expect(up.errors.every((e: { row: number }) => e.row !== 4)).toBe(true);
  });

  it('names a missing required column', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await upload(s, world, 'target,quantity,unit\nT 1,parallax,mas\n');
    expectRowError(res.body.upload, 1, 'value', /needs a value column/);
  });

  it('asks for coordinates of a target the project does not have', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await upload(s, world, 'target,quantity,value,unit\nNobody 7,parallax,12,mas\n');
    expectRowError(res.body.upload, 2, 'ra', /not a target of this project yet/);
  });

  it('flags the same file uploaded twice and commits it again only when confirmed', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n';
    const first = await upload(s, world, file);
    await commit(s, world, first.body.upload.id).expect(200);
    const second = await upload(s, world, file);
    expect(second.body.upload.duplicateOf).toBe(first.body.upload.id);
    const refused = await commit(s, world, second.body.upload.id);
    expect(refused.status).toBe(409);
    expect(refused.body.error.details[0].path).toBe('confirmDuplicate');
    await commit(s, world, second.body.upload.id, { confirmDuplicate: true }).expect(200);
  });

  it('stores text that looks like a spreadsheet formula as text', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const file = 'target,quantity,value,unit,note,instrument,observer_remark\nT 1,parallax,12.5,mas,=HYPERLINK("x"),+CCD,@SUM(1)\n';
    const res = await upload(s, world, file);
    expect(res.body.upload.errors).toEqual([]);
    await commit(s, world, res.body.upload.id).expect(200);
    const row = await world.db('measurements').first();
    expect(row.note).toBe('=HYPERLINK("x")');
    expect(row.instrument).toBe('+CCD');
    expect(JSON.parse(row.extra_json)).toEqual({ observer_remark: '@SUM(1)' });
  });

  it('refuses a reader’s upload and commit with 403', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    const made = await upload(observer, world, 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n');
    const reader = await signIn(world.app, 'reader');
    expect((await upload(reader, world, 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n')).status).toBe(403);
    expect((await commit(reader, world, made.body.upload.id)).status).toBe(403);
    expect(await countRows(world, 'measurements')).toBe(0);
  });

  it('answers 404 to a commit of another project’s preview', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    const made = await upload(observer, world, 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n');
    const outsider = await signIn(world.app, 'outsider');
    // The outsider leads the other project: the upload id is real, but not in that project.
    expect((await commit(outsider, world, made.body.upload.id, {}, world.otherProjectId)).status).toBe(404);
    expect((await commit(outsider, world, made.body.upload.id, {}, world.projectId)).status).toBe(404);
    expect(await countRows(world, 'measurements')).toBe(0);
  });

  it('warns in the preview when a target lies near the Sun on the night', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // On 2024-03-20 the Sun is at RA ≈ 0°, Dec ≈ 0° (March equinox).
    const res = await upload(s, world, 'target,ra,dec,quantity,value,unit,band,observed_at\nNear 1,00 10 00,+01 00 00,magnitude,3.1,mag,V,2024-03-20T12:00:00Z\n');
    expect(res.body.upload.cautions[0].message).toMatch(/from the Sun.*solar filter/);
  });
});

describe('measurement uploads: the preview summary agrees with its rows', () => {
  const summaryOf = (up: { newTargets: string[]; newTargetErrorRows: number; everyRowKnownTarget: boolean }) => ({
    newTargets: up.newTargets,
    newTargetErrorRows: up.newTargetErrorRows,
    everyRowKnownTarget: up.everyRowKnownTarget,
  });

  it('does not say every row names a known target when the only row for a new target has an error', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await upload(s, world, 'target,ra,dec,quantity,value,unit\nNew 5,05 14 32.3,-08 12 05,parallax,abc,mas\nT 1,,,parallax,12,mas\n');
    expect(res.body.upload.errors.map((e: { row: number }) => e.row)).toEqual([2]);
    expect(summaryOf(res.body.upload)).toEqual({ newTargets: [], newTargetErrorRows: 1, everyRowKnownTarget: false });
  });

  it('never lists a target among those to be created when it cannot be created', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    // No row gives New 6 a position, so every one of its rows fails, each saying why.
    const res = await upload(s, world, 'target,quantity,value,unit\nNew 6,parallax,12,mas\nNew 6,distance,80,pc\nT 1,parallax,12,mas\n');
    expect(res.body.upload.errors.filter((e: { column: string }) => e.column === 'ra').map((e: { row: number }) => e.row)).toEqual([2, 3]);
    expect(summaryOf(res.body.upload)).toEqual({ newTargets: [], newTargetErrorRows: 2, everyRowKnownTarget: false });
  });

  it('lists a new target with one good row, and counts its failing row apart', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await upload(
      s,
      world,
      'target,ra,dec,quantity,value,unit\nNew 7,05 14 32.3,-08 12 05,parallax,12,mas\nNew 7,,,parallax,-3,parsec\nNew 8,,,distance,x,pc\n',
    );
    expect(summaryOf(res.body.upload)).toEqual({ newTargets: ['New 7'], newTargetErrorRows: 2, everyRowKnownTarget: false });
  });

  it('says every row names a known target only when it is so', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const known = await upload(s, world, 'target,quantity,value,unit\nT 1,parallax,12,mas\nt1,distance,80,pc\n');
    expect(summaryOf(known.body.upload)).toEqual({ newTargets: [], newTargetErrorRows: 0, everyRowKnownTarget: true });
    // A row that names no target at all is not a row for a known one.
    const unnamed = await upload(s, world, 'target,quantity,value,unit\nT 1,parallax,12,mas\n,distance,80,pc\n');
    expect(summaryOf(unnamed.body.upload)).toEqual({ newTargets: [], newTargetErrorRows: 0, everyRowKnownTarget: false });
  });
});
