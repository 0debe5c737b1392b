import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const targetsUrl = (w: World) => `/api/projects/${w.projectId}/targets`;

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('input a hostile member might send', () => {
  it('a search made of SQL finds nothing and changes nothing: it is a bound value, not SQL (ASVS 5.3.4)', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    for (const q of ["' OR '1'='1", "x'); DELETE FROM targets; --", '%', '_']) {
      const res = await agent.get(targetsUrl(world)).query({ q });
      expect(res.status, q).toBe(200);
      expect(res.body.total, q).toBe(0);
    }
    expect(Number((await world.db('targets').count('* as n').first())?.n)).toBe(1);
  });

  it('a parameter sent twice is refused by name rather than one copy silently chosen (ASVS 5.1.1)', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    const res = await agent.get(`${targetsUrl(world)}?sort=raDeg&sort=designation`);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('sort');
  });

  it('a designation is held to its allowed characters, naming the field (ASVS 5.1.3)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const res = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: '<img src=x onerror=alert(1)>', ra: '01 00 00', dec: '+01 00 00' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('designation');
  });

  it('markup in free-text notes is kept as text and answered as JSON text, never as HTML (ASVS 5.3.1, 5.3.3)', async () => {
    world = await makeWorld();
    const { agent, csrf } = await signIn(world.app, 'observer');
    const notes = '<img src=x onerror=alert(1)> and </script><script>alert(2)</script>';
    const made = await agent.post(targetsUrl(world)).set('X-CSRF-Token', csrf).send({ designation: 'Markup 1', ra: '01 00 00', dec: '+01 00 00', notes });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const read = await agent.get(`${targetsUrl(world)}/${made.body.target.id}`).expect(200);
    expect(read.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(read.body.target.notes).toBe(notes);
  });
});
