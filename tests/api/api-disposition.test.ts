import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

/** The filename of an RFC 6266 §4.1 `attachment` header, from its filename*=UTF-8'' (RFC 8187 §3.2) or quoted filename form. */
function attachmentName(header: string | undefined): string | undefined {
  const extended = /^attachment;\s*filename\*=UTF-8''([^;\s]+)$/i.exec(header ?? '');
  if (extended) return decodeURIComponent(extended[1]!);
  return /^attachment;\s*filename="([^"\\]*)"$/i.exec(header ?? '')?.[1];
}

describe('Content-Disposition of API answers (ASVS 4.0.3 14.4.2, RFC 6266)', () => {
  it('marks every JSON answer an attachment named api.json: signed in, anonymous, refused, invalid and unknown alike', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'reader');
    const answers = {
      me: await agent.get('/api/auth/me').expect(200),
      targets: await agent.get(`/api/projects/${world.projectId}/targets`).expect(200),
      anonymous: await request(world.app).get('/api/projects').expect(401),
      forbidden: await agent.post('/api/projects').set('X-CSRF-Token', csrf).send({ name: 'Not for a reader' }).expect(403),
      invalid: await request(world.app).post('/api/auth/login').send({ email: 'not an address', password: '' }).expect(400),
      unknown: await request(world.app).get('/api/no-such-route').expect(404),
    };
    for (const [which, res] of Object.entries(answers)) {
      expect(res.headers['content-type'], which).toMatch(/^application\/json/);
      expect(res.headers['content-disposition'], which).toBe('attachment; filename="api.json"');
    }
  });

  it('leaves a download its own name: the trail and values exports, an upload template and the OpenAPI document', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'lead');
    const P = `/api/projects/${world.projectId}`;
    const files = {
      trail: await agent.get(`${P}/trail/export?format=csv`).buffer(true).expect(200),
      values: await agent.get(`${P}/values/export?format=csv`).buffer(true).expect(200),
      template: await agent.get(`${P}/uploads/templates/long.csv`).buffer(true).expect(200),
      openapi: await agent.get('/api/openapi.json').expect(200),
    };
    expect(attachmentName(files.trail.headers['content-disposition'])).toBe('TEST-trail.csv');
    expect(attachmentName(files.values.headers['content-disposition'])).toBe('TEST-values.csv');
    expect(attachmentName(files.template.headers['content-disposition'])).toBe('starledger-long-template.csv');
    // The API reference page's link offers this name; the header outranks the link's download attribute (HTML, "downloading hyperlinks").
    expect(attachmentName(files.openapi.headers['content-disposition'])).toBe('starledger-openapi.json');
  });
});
