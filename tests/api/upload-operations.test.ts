import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Request, Response } from 'express';
import { describeForLog, errorHandler } from '../../server/middleware/error-handler';
import { makeWorld, signIn, type Session, type World } from '../support/world';

let world: World;
afterEach(async () => {
  vi.restoreAllMocks();
  await world?.db.destroy();
});

const uploadsUrl = (w: World) => `/api/projects/${w.projectId}/uploads`;

function send(s: Session, w: World, content: string, filename: string, fields: Record<string, string> = {}) {
  let req = s.agent.post(uploadsUrl(w)).set('X-CSRF-Token', s.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.from(content), filename);
}

describe('upload file names', () => {
  it('keeps a name with non-ASCII letters as sent, in the upload, the list and the download', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await send(s, world, 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n', 'Größe-α.csv');
    expect(res.status).toBe(201);
    expect(res.body.upload.filename).toBe('Größe-α.csv');
    const list = await s.agent.get(uploadsUrl(world)).expect(200);
    expect(list.body.uploads[0].filename).toBe('Größe-α.csv');
    const file = await s.agent.get(`${uploadsUrl(world)}/${res.body.upload.id}/file`).expect(200);
    expect(file.headers['content-disposition']).toBe(`attachment; filename*=UTF-8''${encodeURIComponent('Größe-α.csv')}`);
  });
});

describe('a spectrum for a target that does not exist', () => {
  it('answers 400 naming targetId, stores nothing and logs nothing of the file', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = await send(s, world, 'wavelength_nm,flux\n500,1.0\n510,1.1\nMARKER-IN-FILE,1\n', 'spectrum.csv', { kind: 'spectrum', targetId: '987654' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.details).toEqual([{ path: 'targetId', message: expect.stringMatching(/no target with id 987654/) }]);
    expect(await world.db('uploads').count<{ n: number }[]>('* as n')).toEqual([{ n: 0 }]);
    expect(logged).not.toHaveBeenCalled();
  });

  it('answers 400 for another project’s target as for a missing one', async () => {
    world = await makeWorld();
    const at = '2026-11-30T22:00:00.000Z';
    const [other] = await world.db('targets')
      .insert({ project_id: world.otherProjectId, designation: 'O 1', designation_key: 'o1', ra_deg: 1, dec_deg: 1, notes: '', tags: '[]', created_at: at, updated_at: at })
      .returning('id');
    const s = await signIn(world.app, 'observer');
    const res = await send(s, world, 'wavelength_nm,flux\n500,1.0\n', 'spectrum.csv', { kind: 'spectrum', targetId: String(other.id) });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('targetId');
  });
});

describe('the log of an unexpected error', () => {
  it('keeps the SQL and the cause but never the values bound to it', async () => {
    world = await makeWorld();
    const secret = Buffer.from('CONTENT-OF-A-FILE');
    const failure = await world.db('uploads')
      .insert({ project_id: 999_999, user_id: null, kind: 'measurements', filename: 'x.csv', size_bytes: 1, sha256: 'SHA-MARKER', content: secret, status: 'previewed', created_at: 'now' })
      .then(() => null, (e: unknown) => e);
    expect(failure).toBeInstanceOf(Error);
    const logged = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    const res = { headersSent: false, status: vi.fn().mockReturnThis(), json: vi.fn() } as unknown as Response;
    errorHandler(failure, { method: 'POST', baseUrl: '/api', path: '/projects/1/uploads' } as Request, res, () => undefined);
    expect(res.status).toHaveBeenCalledWith(500);
    const text = logged.mock.calls.flat().map(String).join('\n');
    expect(text).toMatch(/FOREIGN KEY constraint failed/);
    expect(text).toMatch(/insert into `uploads`/);
    for (const leak of [secret.toString('hex'), 'CONTENT-OF-A-FILE', 'SHA-MARKER']) expect(text).not.toContain(leak);
    expect(describeForLog({ body: 'a request body' })).not.toContain('a request body');
  });
});
