import Papa from 'papaparse';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import type { Response } from 'superagent';
import { afterEach, describe, expect, it } from 'vitest';
import { QUANTITY_IDS } from '../../shared/physics/quantities';
import { makeWorld, signIn, type Session, type World } from '../support/world';
import { commitFile, NIGHT, newestDerived } from '../support/night';

/**
 * The project's values out, as CSV and as a VOTable 1.4 document. The
 * VOTable is read back with a general XML parser (fast-xml-parser), not with
 * anything of ours, and its fields, units, UCDs and cells are checked
 * against the values the API serves for the target. Units and UCDs are
 * those of the IVOA VOUnits 1.0 and UCD1+ vocabularies (from memory); the
 * namespace rule (VOTable 1.4 keeps the v1.3 namespace) is the standard's,
 * also from memory. The measurements are invented.
 *
 * CSV text cells pass through the server's one neutraliseCell
 * (server/lib/csv.ts), tested with formula-like cells in trail.test.ts; a
 * designation, the only free text here, must start with a letter or digit.
 */
let world: World;
afterEach(async () => world?.db.destroy());




/** Lead uploads a night and approves the luminosity (with what it rests on); the rest stays proposed. */
async function nightWithSomeApproved(w: World) {
  const lead = await signIn(w.app, 'lead');
  await commitFile(lead, w, NIGHT);
  const before = await newestDerived(lead, w);
  await lead.agent
    .post(`/api/projects/${w.projectId}/review`)
    .set('X-CSRF-Token', lead.csrf)
    .send({ decision: 'approve', note: 'Checked.', items: [{ id: before.luminosity.id, version: before.luminosity.version }] })
    .expect(200);
  return { lead, values: await newestDerived(lead, w) };
}

function asText(res: Response, done: (err: Error | null, body: string) => void) {
  let text = '';
  res.setEncoding('utf8');
  res.on('data', (chunk: string) => (text += chunk));
  res.on('end', () => done(null, text));
}

async function download(s: Session, w: World, query: string): Promise<{ text: string; type: string; disposition: string }> {
  const res = await s.agent.get(`/api/projects/${w.projectId}/values/export${query}`).buffer(true).parse(asText).expect(200);
  return { text: res.body as string, type: res.headers['content-type'], disposition: res.headers['content-disposition'] };
}

interface Field {
  '@_name': string;
  '@_datatype': string;
  '@_unit'?: string;
  '@_ucd': string;
}

function readVotable(text: string) {
  expect(XMLValidator.validate(text)).toBe(true);
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: '@_',
    parseTagValue: false,
    trimValues: false,
    isArray: (name) => ['FIELD', 'TR', 'TD', 'INFO'].includes(name),
  });
  const doc = parser.parse(text);
  const vot = doc.VOTABLE;
  const table = vot.RESOURCE.TABLE;
  const fields = table.FIELD as Field[];
  const trs = (table.DATA.TABLEDATA.TR ?? []) as { TD: string[] }[];
  const rows = trs.map((tr) => Object.fromEntries(fields.map((f, i) => [f['@_name'], tr.TD[i]])) as Record<string, string>);
  const info = Object.fromEntries((vot.INFO as { '@_name': string; '@_value': string }[]).map((i) => [i['@_name'], i['@_value']]));
  return { vot, fields, rows, info };
}

function readCsv(text: string): Record<string, string>[] {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

describe('exporting the project values as a VOTable', () => {
  it('is VOTable 1.4 with named, united and UCD-labelled fields, and its cells are the stored values', async () => {
    world = await makeWorld();
    const { lead, values } = await nightWithSomeApproved(world);
    const file = await download(lead, world, '?format=votable&include=proposed');
    expect(file.type).toMatch(/^application\/x-votable\+xml/);
    expect(file.disposition).toContain("filename*=UTF-8''TEST-values.vot.xml");

    const { vot, fields, rows, info } = readVotable(file.text);
    expect(vot['@_version']).toBe('1.4');
    expect(vot['@_xmlns']).toBe('http://www.ivoa.net/xml/VOTable/v1.3');
    expect(info.project).toBe('TEST');
    expect(info.include).toBe('proposed');
    expect(info.exported).toBe('2026-12-01T03:00:00.000Z');

    const byName = Object.fromEntries(fields.map((f) => [f['@_name'], f]));
    const expectField = (name: string, datatype: string, unit: string | undefined, ucd: string) => {
      expect(byName[name], name).toBeDefined();
      expect({ datatype: byName[name]['@_datatype'], unit: byName[name]['@_unit'], ucd: byName[name]['@_ucd'] }, name).toEqual({ datatype, unit, ucd });
    };
    expect(fields.slice(0, 3).map((f) => f['@_name'])).toEqual(['designation', 'ra', 'dec']);
    expectField('designation', 'char', undefined, 'meta.id;meta.main');
    expectField('ra', 'double', 'deg', 'pos.eq.ra;meta.main');
    expectField('dec', 'double', 'deg', 'pos.eq.dec;meta.main');
    expectField('temperature', 'double', 'K', 'phys.temperature.effective');
    expectField('temperature_sigma', 'double', 'K', 'stat.error;phys.temperature.effective');
    expectField('temperature_status', 'char', undefined, 'meta.code.status');
    expectField('temperature_revision', 'int', undefined, 'meta.version');
    expectField('luminosity', 'double', 'W', 'phys.luminosity');
    expectField('radius', 'double', 'm', 'phys.size.radius');
    expectField('distance_parallax', 'double', 'm', 'pos.distance');
    expectField('distance_photometric', 'double', 'm', 'pos.distance');
    expectField('absolute_bolometric_magnitude', 'double', 'mag', 'phys.magAbs.bol');
    expectField('radial_velocity', 'double', 'm.s**-1', 'spect.dopplerVeloc');
    expectField('magnetic_field', 'double', 'T', 'phys.magField');
    expectField('spectral_class_label', 'char', undefined, 'src.spType');
    for (const q of QUANTITY_IDS) expect(byName[q], q).toBeDefined();

    expect(rows).toHaveLength(1);
    const [row] = rows;
    expect(row.designation).toBe('T 1');
    expect(Number(row.ra)).toBe(10);
    expect(Number(row.dec)).toBe(-5);
    const statuses = new Set<string>();
    for (const q of QUANTITY_IDS) {
      const stored = values[q];
      if (!stored || (stored.status !== 'approved' && stored.status !== 'proposed')) {
        expect(row[q], q).toBe('');
        continue;
      }
      expect(Number(row[q]), q).toBe(stored.value);
      expect(Number(row[`${q}_sigma`]), q).toBe(stored.uncertainty);
      expect(row[`${q}_status`], q).toBe(stored.status);
      expect(Number(row[`${q}_revision`]), q).toBe(stored.revision);
      statuses.add(stored.status);
    }
    // The fixture holds both kinds, so the lead's file is seen to carry proposals.
    expect([...statuses].sort()).toEqual(['approved', 'proposed']);
    expect(row.spectral_class_label).toBe(values.spectral_class.label);

    // Against outside sources: Wien's law with b = 2.897771955e-3 m K (CODATA 2018) at 502 nm,
    // and 1/p at 41.2 mas with the IAU 2015 parsec, 648 000/π au of 149 597 870 700 m (IAU 2012).
    const parsec = (648000 / Math.PI) * 149597870700;
    expect(Number(row.temperature_wien) / (2.897771955e-3 / 502e-9)).toBeCloseTo(1, 2);
    expect(Number(row.distance_parallax) / (parsec / 0.0412)).toBeCloseTo(1, 2);
  });

  it("gives a reader approved values only, even when the reader asks for proposals", async () => {
    world = await makeWorld();
    const { values } = await nightWithSomeApproved(world);
    const reader = await signIn(world.app, 'reader');
    const { rows, info } = readVotable((await download(reader, world, '?format=votable&include=proposed')).text);
    expect(info.include).toBe('approved');
    const [row] = rows;
    let approved = 0;
    for (const q of QUANTITY_IDS) {
      const stored = values[q];
      if (stored?.status === 'approved') {
        approved += 1;
        expect(row[`${q}_status`], q).toBe('approved');
        expect(Number(row[q]), q).toBe(stored.value);
      } else {
        expect(row[q], q).toBe('');
        expect(row[`${q}_status`], q).toBe('');
      }
    }
    expect(approved).toBeGreaterThan(0);
    expect(values.radius.status).toBe('proposed');

    // A PI may see proposals, so the choice is theirs.
    const pi = await signIn(world.app, 'pi');
    expect(readVotable((await download(pi, world, '?format=votable&include=proposed')).text).rows[0].radius_status).toBe('proposed');
    expect(readVotable((await download(pi, world, '?format=votable')).text).rows[0].radius).toBe('');
  });

  it('escapes text, leaves empty cells for what a target lacks, and keeps every target across batches in designation order', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await lead.agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', lead.csrf).send({ designation: "O'Hara's star 1", ra: 20, dec: 30 }).expect(201);
    const at = '2026-11-30T22:00:00.000Z';
    const many = Array.from({ length: 1200 }, (_, i) => {
      const designation = `Z ${String(i).padStart(4, '0')}`;
      return { project_id: world.projectId, designation, designation_key: designation.toLowerCase().replace(/\s+/g, ''), ra_deg: 1, dec_deg: 2, notes: '', tags: '[]', created_at: at, updated_at: at };
    });
    for (let i = 0; i < many.length; i += 100) await world.db('targets').insert(many.slice(i, i + 100));

    const { text } = await download(lead, world, '?format=votable');
    expect(text).toContain('O&apos;Hara&apos;s star 1');
    const { rows } = readVotable(text);
    expect(rows).toHaveLength(1202);
    expect(rows.slice(0, 2).map((r) => r.designation)).toEqual(["O'Hara's star 1", 'T 1']);
    expect(rows[1201].designation).toBe('Z 1199');
    expect(rows[0].temperature).toBe('');
    expect(rows[0].temperature_revision).toBe('');
  });
});

describe('exporting the project values as CSV', () => {
  it('parses back per RFC 4180 with the same columns and values, numbers left as numbers', async () => {
    world = await makeWorld();
    const { lead, values } = await nightWithSomeApproved(world);
    // A receding star: a negative velocity must stay a number, not become quoted text.
    await world.db('derived_values').insert({
      project_id: world.projectId,
      target_id: world.targetId,
      quantity: 'radial_velocity',
      value: -12500,
      uncertainty: 300,
      unit: 'm/s',
      method: 'doppler',
      method_label: 'Doppler shift',
      inputs_json: '[]',
      constants_json: '[]',
      warnings_json: '[]',
      revision: 1,
      status: 'approved',
      created_at: '2026-12-01T00:00:00.000Z',
    });
    const file = await download(lead, world, '?format=csv&include=proposed');
    expect(file.type).toMatch(/^text\/csv/);
    expect(file.disposition).toContain("filename*=UTF-8''TEST-values.csv");
    expect(file.text.split('\r\n').length).toBe(3);

    const [row] = readCsv(file.text);
    const vot = readVotable((await download(lead, world, '?format=votable&include=proposed')).text);
    expect(Object.keys(row)).toEqual(vot.fields.map((f) => f['@_name']));
    expect(row).toEqual(vot.rows[0]);
    expect(Number(row.luminosity)).toBe(values.luminosity.value);
    expect(row.radial_velocity).toBe('-12500');
  });

  it('refuses a format it does not know, naming the field', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    const res = await lead.agent.get(`/api/projects/${world.projectId}/values/export?format=fits`).expect(400);
    expect(JSON.stringify(res.body)).toContain('format');
  });
});
