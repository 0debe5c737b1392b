import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { makeWorld, signIn, type Session, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const HEADER = 'target,ra,dec,quantity,value,uncertainty,unit,band,rest_wavelength,observed_at,note';

/** A readable long-format file of about `bytes` bytes, its rows told apart by `tag`. */
function fileOf(bytes: number, tag: string): Buffer {
  const lines = [HEADER];
  for (let i = 0; Buffer.byteLength(lines.join('\n')) < bytes; i++) lines.push(`GW 9,05 14 32.3,-08 12 05,colour_index,0.65,0.02,mag,B-V,,2026-11-30T22:14:05Z,${tag} ${i}`);
  return Buffer.from(lines.join('\n'));
}

const upload = (s: Session, projectId: number, content: Buffer) =>
  s.agent.post(`/api/projects/${projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', content, 'night.csv');

async function count(table: string) {
  return Number((await world.db(table).count<{ n: number }>('* as n').first())!.n);
}

describe('upload quota per person (ASVS 4.0.3 12.1.3; UPLOAD_QUOTA_MB)', () => {
  it('counts one person’s stored files over every project, refuses 413 naming the file field before storing anything, and leaves others alone', async () => {
    world = await makeWorld();
    // The observer is also a member of the second project, so the quota is seen to span projects.
    await world.db('project_members').insert({ project_id: world.otherProjectId, user_id: world.userIds.observer, role: 'observer', added_at: world.clock.now().toISOString() });
    const quotaBytes = 4000;
    const app = createApp({ db: world.db, clock: world.clock, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, adminSecondFactor: 'optional', uploadQuotaMb: quotaBytes / 1024 / 1024 });
    const observer = await signIn(app, 'observer');
    const lead = await signIn(app, 'lead');

    const first = fileOf(2500, 'first');
    await upload(observer, world.projectId, first).expect(201);
    const [uploadsBefore, trailBefore] = [await count('uploads'), await count('trail_events')];

    const second = fileOf(2000, 'second');
    const refused = await upload(observer, world.otherProjectId, second).expect(413);
    expect(refused.body.error.code).toBe('upload_quota_exceeded');
    expect(refused.body.error.details).toEqual([{ path: 'file', message: refused.body.error.message }]);
    expect(refused.body.error.message).toContain('Nothing was stored');
    expect(refused.body.error.message).toContain(`${(first.length / 1024 / 1024).toFixed(1)} MB`);
    expect([await count('uploads'), await count('trail_events')]).toEqual([uploadsBefore, trailBefore]);

    // What still fits is taken, to the byte; someone else's uploads have their own quota.
    await upload(observer, world.otherProjectId, fileOf(quotaBytes - first.length - 200, 'fits')).expect(201);
    await upload(lead, world.projectId, fileOf(2500, 'lead')).expect(201);
    expect(await count('uploads')).toBe(uploadsBefore + 2);
  });

  it('counts one person’s stored files, discarded ones too (each keeps its file), and refuses the one past UPLOAD_QUOTA_FILES with 413 naming the file field', async () => {
    world = await makeWorld();
    const app = createApp({ db: world.db, clock: world.clock, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, adminSecondFactor: 'optional', uploadQuotaFiles: 2 });
    const observer = await signIn(app, 'observer');
    const first = await upload(observer, world.projectId, fileOf(300, 'one')).expect(201);
    await observer.agent.post(`/api/projects/${world.projectId}/uploads/${first.body.upload.id}/discard`).set('X-CSRF-Token', observer.csrf).expect(200);
    await upload(observer, world.projectId, fileOf(300, 'two')).expect(201);
    const uploadsBefore = await count('uploads');
    const refused = await upload(observer, world.projectId, fileOf(300, 'three')).expect(413);
    expect(refused.body.error).toMatchObject({ code: 'upload_quota_exceeded', details: [{ path: 'file', message: refused.body.error.message }] });
    expect(refused.body.error.message).toBe('Your uploads already keep 2 files, the most each person may store. Nothing was stored. Ask the site admin to raise the quota.');
    expect(await count('uploads')).toBe(uploadsBefore);
    await upload(await signIn(app, 'lead'), world.projectId, fileOf(300, 'lead')).expect(201);
  });

  it('has no limit when the app is given none', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    for (const tag of ['a', 'b', 'c']) await upload(observer, world.projectId, fileOf(200_000, tag)).expect(201);
  });
});
