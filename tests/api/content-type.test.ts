import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { emails, makeWorld, PASSWORD, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => {
  await world?.db.destroy();
});

// OWASP ASVS 4.0.3 13.1.5 and 13.2.5: a request whose Content-Type the route does not take is refused;
// RFC 9110 §15.5.16: 415 Unsupported Media Type is the status for a body in a format the target does not support.
describe('a body of a type the route does not read', () => {
  it('answers 415 naming application/json to text/plain, form-encoded or XML sent to a JSON route', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'lead');
    const url = `/api/projects/${world.projectId}/targets/${world.targetId}`;
    for (const [type, body] of [
      ['text/plain', '{"notes":"sent as text"}'],
      ['application/x-www-form-urlencoded', 'notes=sent+as+a+form'],
      ['application/xml', '<notes>sent as XML</notes>'],
    ]) {
      const res = await s.agent.patch(url).set('X-CSRF-Token', s.csrf).set('Content-Type', type).send(body);
      expect(res.status, type).toBe(415);
      expect(res.body.error.code, type).toBe('unsupported_media_type');
      expect(res.body.error.message, type).toBe(`This request's body must be sent as application/json, not ${type}.`);
    }
    const [target] = await world.db('targets').where('id', world.targetId).select('notes');
    expect(target.notes).toBe('');
  });

  it('answers 415 to a sign-in sent as text/plain, and takes one sent as JSON with a charset', async () => {
    world = await makeWorld();
    const text = await request(world.app).post('/api/auth/login').set('Content-Type', 'text/plain').send(JSON.stringify({ email: emails.reader, password: PASSWORD }));
    expect(text.status).toBe(415);
    expect(text.body.error.message).toMatch(/application\/json, not text\/plain/);
    const json = await request(world.app).post('/api/auth/login').set('Content-Type', 'application/json; charset=utf-8').send(JSON.stringify({ email: emails.reader, password: PASSWORD }));
    expect(json.status).toBe(200);
  });

  it('answers 415 naming multipart/form-data to JSON sent to the upload route, and stores nothing', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const res = await s.agent
      .post(`/api/projects/${world.projectId}/uploads`)
      .set('X-CSRF-Token', s.csrf)
      .send({ kind: 'measurements', file: 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n' });
    expect(res.status).toBe(415);
    expect(res.body.error.message).toBe("This request's body must be sent as multipart/form-data, not application/json.");
    expect(await world.db('uploads').count<{ n: number | string }[]>('* as n').then((r) => Number(r[0].n))).toBe(0);
  });

  it('still answers 401 to a caller who is not signed in, whatever the body', async () => {
    world = await makeWorld();
    const res = await request(world.app).post('/api/tokens').set('Content-Type', 'text/plain').send('a token');
    expect(res.status).toBe(401);
  });

  it('leaves requests without a body alone: a GET and a DELETE pass, a POST with no body is told what is missing', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'lead');
    const target = `/api/projects/${world.projectId}/targets/${world.targetId}`;
    expect((await s.agent.get(target)).status).toBe(200);
    const created = await s.agent.post('/api/tokens').set('X-CSRF-Token', s.csrf).send({ currentPassword: PASSWORD, name: 'pipeline' });
    expect(created.status).toBe(201);
    const revoked = await s.agent.delete(`/api/tokens/${created.body.apiToken.id}`).set('X-CSRF-Token', s.csrf);
    expect(revoked.status).toBe(204);
    const empty = await s.agent.post('/api/tokens').set('X-CSRF-Token', s.csrf);
    expect(empty.status).toBe(400);
    expect(empty.body.error.details[0].path).toBe('name');
  });
});
