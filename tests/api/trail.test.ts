import Papa from 'papaparse';
import { afterEach, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { trailEntrySchema, trailPageSchema } from '../../shared/schemas/trail';
import { appendTrail, appendTrailMany, type TrailEntry } from '../../server/modules/trail/trail.repository';
import { makeWorld, signIn, type Session, type World, PASSWORD } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const trailUrl = (w: World, query = '') => `/api/projects/${w.projectId}/trail${query}`;
const exportUrl = (w: World, query = '') => `/api/projects/${w.projectId}/trail/export${query}`;

function entry(w: World, over: Partial<TrailEntry> = {}): TrailEntry {
  return { projectId: w.projectId, actorUserId: w.userIds.lead, action: 'target.updated', entityType: 'target', entityId: w.targetId, targetId: w.targetId, ...over };
}

async function addTarget(s: Session, w: World, designation: string) {
  const res = await s.agent.post(`/api/projects/${w.projectId}/targets`).set('X-CSRF-Token', s.csrf).send({ designation, ra: 10, dec: 10 }).expect(201);
  return res.body.target.id as number;
}

/** Reads the CSV back the way a spreadsheet import would: RFC 4180 fields, CRLF records. */
function readCsv(text: string): string[][] {
  const parsed = Papa.parse<string[]>(text, { header: false, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

describe('the review trail is append-only in the database', () => {
  it('refuses an UPDATE issued directly, and the entry stays as it was', async () => {
    world = await makeWorld();
    await appendTrail(world.db, entry(world, { note: 'as written' }), new Date('2026-11-30T23:00:00Z'));
    const before = await world.db('trail_events').first();
    await expect(world.db('trail_events').where({ id: before.id }).update({ note: 'rewritten' })).rejects.toThrow(/append-only/);
    await expect(world.db('trail_events').update({ actor_user_id: null })).rejects.toThrow(/append-only/);
    expect(await world.db('trail_events').where({ id: before.id }).first()).toEqual(before);
  });

  it('refuses a DELETE issued directly, and the entry is still there', async () => {
    world = await makeWorld();
    await appendTrail(world.db, entry(world, { note: 'keep me' }), new Date('2026-11-30T23:00:00Z'));
    const before = await world.db('trail_events').first();
    await expect(world.db('trail_events').where({ id: before.id }).delete()).rejects.toThrow(/append-only/);
    await expect(world.db('trail_events').delete()).rejects.toThrow(/append-only/);
    expect(await world.db('trail_events').select()).toEqual([before]);
  });
});

describe('trail page', () => {
  it('filters by person, action, target and inclusive UTC dates, newest first, paginated on the server', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    const lead = await signIn(world.app, 'lead');
    const a = await addTarget(observer, world, 'Filter A');
    const b = await addTarget(lead, world, 'Filter B');
    await lead.agent.patch(`/api/projects/${world.projectId}/targets/${world.targetId}`).set('X-CSRF-Token', lead.csrf).send({ notes: 'Seen again.' }).expect(200);
    // Entries on chosen days, around the edges of a date range.
    for (const at of ['2026-11-01T12:00:00.000Z', '2026-11-15T00:00:00.000Z', '2026-11-20T23:59:59.999Z', '2026-11-21T00:00:00.000Z']) {
      await appendTrail(world.db, entry(world, { action: 'member.added', entityType: 'member', entityId: 1, targetId: null, note: at }), new Date(at));
    }

    const all = trailPageSchema.parse((await lead.agent.get(trailUrl(world)).expect(200)).body);
    expect(all.total).toBe(7);
    // The app's clock stands at 2026-12-01T03:00Z, after the hand-written days; ties go newest id first.
    expect(all.items.map((e) => e.action)).toEqual(['target.updated', 'target.created', 'target.created', 'member.added', 'member.added', 'member.added', 'member.added']);
    expect(all.items[0]).toMatchObject({ actor: { id: world.userIds.lead, name: 'Test lead' }, targetId: world.targetId, targetDesignation: 'T 1', after: { notes: 'Seen again.' } });

    const byPerson = (await lead.agent.get(trailUrl(world, `?actorId=${world.userIds.observer}`)).expect(200)).body;
    expect(byPerson.items.map((e: { targetId: number }) => e.targetId)).toEqual([a]);
    const byAction = (await lead.agent.get(trailUrl(world, '?action=target.created')).expect(200)).body;
    expect(byAction.items.map((e: { targetDesignation: string }) => e.targetDesignation)).toEqual(['Filter B', 'Filter A']);
    const byTarget = (await lead.agent.get(trailUrl(world, `?targetId=${b}`)).expect(200)).body;
    expect(byTarget.total).toBe(1);
    expect(byTarget.items[0].actor.id).toBe(world.userIds.lead);

    const range = (await lead.agent.get(trailUrl(world, '?from=2026-11-15&to=2026-11-20')).expect(200)).body;
    expect(range.items.map((e: { note: string }) => e.note)).toEqual(['2026-11-20T23:59:59.999Z', '2026-11-15T00:00:00.000Z']);
    const oneDay = (await lead.agent.get(trailUrl(world, '?from=2026-11-21&to=2026-11-21')).expect(200)).body;
    expect(oneDay.items.map((e: { note: string }) => e.note)).toEqual(['2026-11-21T00:00:00.000Z']);

    const page1 = (await lead.agent.get(trailUrl(world, '?pageSize=3&page=1')).expect(200)).body;
    const page3 = (await lead.agent.get(trailUrl(world, '?pageSize=3&page=3')).expect(200)).body;
    expect(page1).toMatchObject({ total: 7, page: 1, pageSize: 3 });
    expect(page1.items.map((e: { id: number }) => e.id)).toEqual(all.items.slice(0, 3).map((e) => e.id));
    expect(page3.items.map((e: { id: number }) => e.id)).toEqual([all.items[6].id]);

    const bad = await lead.agent.get(trailUrl(world, '?from=15/11/2026'));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('from');
  });

  it('keeps naming a deleted target from what the trail recorded of it', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    // A value entry carries no designation of its own; it takes the name from the target's deletion entry.
    await appendTrail(world.db, entry(world, { action: 'value.approved', entityType: 'derived_value', entityId: 9, after: { status: 'approved' } }), new Date('2026-11-30T23:00:00Z'));
    await lead.agent.delete(`/api/projects/${world.projectId}/targets/${world.targetId}`).set('X-CSRF-Token', lead.csrf).expect(204);
    const res = (await lead.agent.get(trailUrl(world, `?targetId=${world.targetId}`)).expect(200)).body;
    expect(res.items.map((e: { action: string }) => e.action)).toEqual(['target.deleted', 'value.approved']);
    expect(res.items.map((e: { targetDesignation: string }) => e.targetDesignation)).toEqual(['T 1', 'T 1']);
  });

  it('shows readers nothing (403) and non-members that there is nothing (404)', async () => {
    world = await makeWorld();
    for (const url of [trailUrl(world), exportUrl(world), exportUrl(world, '?format=json')]) {
      const reader = await signIn(world.app, 'reader');
      const r = await reader.agent.get(url);
      expect(r.status).toBe(403);
      expect(r.body.error.code).toBe('forbidden');
      const outsider = await signIn(world.app, 'outsider');
      const o = await outsider.agent.get(url);
      expect(o.status).toBe(404);
      expect(o.body.error.code).toBe('not_found');
    }
    const pi = await signIn(world.app, 'pi');
    await pi.agent.get(trailUrl(world)).expect(200);
  });
});

describe('trail export', () => {
  it('neutralises every cell a spreadsheet would run as a formula, and quotes per RFC 4180', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    const dangerous = ["=cmd|' /C calc'!A0", '=HYPERLINK("http://x.invalid","open")', '+1', '-2', '@SUM(A1:A2)', '\tTAB', '\rCR'];
    const harmless = ['Cloud at 23h, "thin"; re-observe\nnext night', 'plain'];
    const at = new Date('2026-11-30T23:00:00Z');
    for (const note of [...dangerous, ...harmless]) await appendTrail(world.db, entry(world, { note }), at);
    // A JSON cell begins with { or [, a bare JSON value may begin with - or a quote.
    await appendTrail(world.db, entry(world, { before: -2, after: '=1+1', note: 'bare values' }), at);
    await world.db('users').where({ id: world.userIds.observer }).update({ name: '@Observer' });
    await appendTrail(world.db, entry(world, { actorUserId: world.userIds.observer, note: 'by a person with an awkward name' }), at);

    const res = await lead.agent.get(exportUrl(world)).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe("attachment; filename*=UTF-8''TEST-trail.csv");
    const rows = readCsv(res.text);
    expect(rows[0]).toEqual(['id', 'time_utc', 'person', 'action', 'subject', 'target', 'before', 'after', 'note']);
    const body = rows.slice(1);
    const notes = body.map((r) => r[8]);
    for (const d of dangerous) expect(notes).toContain(`'${d}`);
    for (const h of harmless) expect(notes).toContain(h);
    // No cell anywhere still begins with a formula character.
    for (const cell of body.flat()) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
    const bare = body.find((r) => r[8] === 'bare values')!;
    expect(bare.slice(2, 8)).toEqual(['Test lead', 'target.updated', `target ${world.targetId}`, 'T 1', "'-2", '"=1+1"']);
    expect(body.find((r) => r[8] === 'by a person with an awkward name')![2]).toBe("'@Observer");
    expect(body[0][1]).toBe('2026-11-30T23:00:00.000Z');
    // RFC 4180: records end in CRLF, and a field with a quote is quoted with the quote doubled.
    expect(res.text.startsWith('id,time_utc,person,action,subject,target,before,after,note\r\n')).toBe(true);
    expect(res.text).toContain('"Cloud at 23h, ""thin""; re-observe\nnext night"');
  });

  it('exports the filtered trail as JSON entries', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await addTarget(lead, world, 'Json A');
    await lead.agent.patch(`/api/projects/${world.projectId}/targets/${world.targetId}`).set('X-CSRF-Token', lead.csrf).send({ notes: 'n' }).expect(200);
    const res = await lead.agent.get(exportUrl(world, '?format=json&action=target.created')).expect(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['content-disposition']).toBe("attachment; filename*=UTF-8''TEST-trail.json");
    const entries = z.array(trailEntrySchema).parse(res.body);
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ action: 'target.created', targetDesignation: 'Json A', actor: { name: 'Test lead' }, after: { designation: 'Json A' } });
    const none = await lead.agent.get(exportUrl(world, '?format=json&from=2030-01-01')).expect(200);
    expect(none.body).toEqual([]);
  });

  it('streams a long trail in batches without losing or repeating an entry', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    const entries = Array.from({ length: 2345 }, (_, i) => entry(world, { note: `n${i}` }));
    await world.db.transaction((trx) => appendTrailMany(trx, entries, new Date('2026-11-30T23:00:00Z')));
    const csv = readCsv((await lead.agent.get(exportUrl(world)).expect(200)).text).slice(1);
    expect(csv).toHaveLength(2345);
    expect(new Set(csv.map((r) => r[0])).size).toBe(2345);
    expect(csv[0][8]).toBe('n2344');
    expect(csv[2344][8]).toBe('n0');
    const json = (await lead.agent.get(exportUrl(world, '?format=json')).expect(200)).body;
    expect(json.map((e: { note: string }) => e.note)).toEqual(csv.map((r) => r[8]));
  });
});

describe('what writes the trail', () => {
  it('records an upload, each target it creates, a discard, and tokens made and revoked', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    const file = 'target,ra,dec,quantity,value,uncertainty,unit\nNew 1,01 00 00,+10 00 00,parallax,10,0.5,mas\nNew 2,02 00 00,+20 00 00,parallax,20,0.5,mas\nT 1,,,parallax,5,0.5,mas\n';
    const made = await observer.agent.post(`/api/projects/${world.projectId}/uploads`).set('X-CSRF-Token', observer.csrf).attach('file', Buffer.from(file), 'night.csv').expect(201);
    await observer.agent.post(`/api/projects/${world.projectId}/uploads/${made.body.upload.id}/commit`).set('X-CSRF-Token', observer.csrf).send({}).expect(200);
    const other = await observer.agent.post(`/api/projects/${world.projectId}/uploads`).set('X-CSRF-Token', observer.csrf).attach('file', Buffer.from(file), 'again.csv').expect(201);
    await observer.agent.post(`/api/projects/${world.projectId}/uploads/${other.body.upload.id}/discard`).set('X-CSRF-Token', observer.csrf).expect(200);

    const created = (await observer.agent.get(trailUrl(world, '?action=target.created')).expect(200)).body.items;
    expect(created.map((e: { targetDesignation: string }) => e.targetDesignation).sort()).toEqual(['New 1', 'New 2']);
    const ids = (await world.db('targets').whereIn('designation', ['New 1', 'New 2']).orderBy('designation').select('id')).map((r) => r.id);
    expect(created.map((e: { targetId: number }) => e.targetId).sort()).toEqual(ids.sort());
    expect(created[0].after.uploadId).toBe(made.body.upload.id);
    const committed = (await observer.agent.get(trailUrl(world, '?action=upload.committed')).expect(200)).body.items;
    expect(committed).toHaveLength(1);
    expect(committed[0]).toMatchObject({ entityId: made.body.upload.id, after: { filename: 'night.csv', measurementsAdded: 3, targetsCreated: 2 } });
    const discarded = (await observer.agent.get(trailUrl(world, '?action=upload.discarded')).expect(200)).body.items;
    expect(discarded.map((e: { entityId: number }) => e.entityId)).toEqual([other.body.upload.id]);

    const token = await observer.agent.post('/api/tokens').set('X-CSRF-Token', observer.csrf).send({ currentPassword: PASSWORD, name: 'pipeline' }).expect(201);
    await observer.agent.delete(`/api/tokens/${token.body.apiToken.id}`).set('X-CSRF-Token', observer.csrf).expect(204);
    const tokenEntries = await world.db('trail_events').where({ entity_type: 'token' }).orderBy('id');
    expect(tokenEntries.map((e) => [e.action, e.project_id, e.actor_user_id, e.entity_id])).toEqual([
      ['token.created', null, world.userIds.observer, token.body.apiToken.id],
      ['token.revoked', null, world.userIds.observer, token.body.apiToken.id],
    ]);
    // The token's secret is never written to the trail.
    expect(JSON.stringify(tokenEntries)).not.toContain(token.body.token);
  });
});

describe('recent activity', () => {
  it('lists the newest entries of the projects whose trail the person may read', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    await addTarget(lead, world, 'Seen 1');
    const outsider = await signIn(world.app, 'outsider');
    await outsider.agent.post(`/api/projects/${world.otherProjectId}/targets`).set('X-CSRF-Token', outsider.csrf).send({ designation: 'Elsewhere', ra: 1, dec: 1 }).expect(201);

    const mine = (await lead.agent.get('/api/activity').expect(200)).body.items;
    expect(mine.map((e: { projectCode: string; targetDesignation: string }) => [e.projectCode, e.targetDesignation])).toEqual([['TEST', 'Seen 1']]);
    const theirs = (await outsider.agent.get('/api/activity?limit=5').expect(200)).body.items;
    expect(theirs.map((e: { projectCode: string }) => e.projectCode)).toEqual(['OTHER']);
    // A reader's role does not include the trail, so nothing of the project shows.
    const reader = await signIn(world.app, 'reader');
    expect((await reader.agent.get('/api/activity').expect(200)).body.items).toEqual([]);
    const tooMany = await lead.agent.get('/api/activity?limit=500');
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.details[0].path).toBe('limit');
  });
});
