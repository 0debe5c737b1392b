import { afterEach, describe, expect, it, vi } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => {
  vi.restoreAllMocks();
  await world?.db.destroy();
});

// OWASP ASVS 4.0.3 7.4.1: an unexpected error is answered with a generic message and a unique id that support can use to find it.
describe('an unexpected server error', () => {
  it('answers 500 with a random reference that also stands on the log line, and says nothing of the cause', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'reader');
    // The target list then asks for a table that is not there: a fault no request can cause, on either engine.
    await world.db.schema.renameTable('targets', 'targets_moved');

    const first = await s.agent.get(`/api/projects/${world.projectId}/targets`);
    const second = await s.agent.get(`/api/projects/${world.projectId}/targets`);

    expect(first.status).toBe(500);
    expect(first.body.error.code).toBe('internal');
    // An RFC 9562 UUID (version 4, variant 10), named in the message a person reads as well.
    expect(first.body.error.reference).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(first.body.error.message).toContain(first.body.error.reference);
    expect(second.body.error.reference).not.toBe(first.body.error.reference);

    const lines = world.logText.filter((line) => JSON.parse(line).event === 'server_error');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toContain(first.body.error.reference);
    expect(lines[1]).toContain(second.body.error.reference);
    // The log keeps the cause (the SQL and the engine's words: SQLite's "no such table", PostgreSQL's 42P01 "relation … does not exist")…
    expect(lines[0]).toMatch(/targets/);
    expect(lines[0]).toMatch(/no such table|does not exist/);
    // …the answer none of it: no stack frame, no SQL, no table name.
    const body = first.text;
    for (const leak of [/\bat \S+ \(/, /\.ts:\d+/, /select /i, /targets/, /no such table|does not exist/]) expect(body).not.toMatch(leak);
    expect(Object.keys(first.body.error).sort()).toEqual(['code', 'message', 'reference']);
  });
});
