import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { accountExportSchema } from '../../shared/schemas/account-export';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

describe('GET /api/account/export: a person’s own data (ASVS 4.0.3 8.3.2)', () => {
  it('is a JSON file to save, named by the day, with the account, memberships, sessions, mail preferences, tokens and trail entries of the caller only', async () => {
    world = await makeWorld();
    const at = world.clock.now().toISOString();
    const { db, userIds } = world;
    await db('api_tokens').insert([
      { user_id: userIds.observer, name: 'Nightly pipeline', token_hash: 'f'.repeat(64), prefix: 'slt_observ', created_at: at, expires_at: '2027-03-01T00:00:00.000Z' },
      { user_id: userIds.lead, name: 'Lead’s own token', token_hash: 'e'.repeat(64), prefix: 'slt_leadtk', created_at: at, expires_at: '2027-03-01T00:00:00.000Z' },
    ]);
    const observer = await signIn(world.app, 'observer');
    const lead = await signIn(world.app, 'lead');
    // A trail entry the observer makes, and one the lead makes, which must stay out of the observer's file.
    await observer.agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', observer.csrf).send({ designation: 'Obs 7', ra: '01 00 00', dec: '+03 00 00' }).expect(201);
    await lead.agent.post(`/api/projects/${world.projectId}/targets`).set('X-CSRF-Token', lead.csrf).send({ designation: 'Lead 9', ra: '02 00 00', dec: '+04 00 00' }).expect(201);
    await observer.agent.patch(`/api/projects/${world.projectId}/mail-preferences`).set('X-CSRF-Token', observer.csrf).send({ weeklySummary: true }).expect(200);

    const res = await observer.agent.get('/api/account/export').set('User-Agent', 'Mozilla/5.0 (X11; Linux x86_64; rv:133.0) Gecko/20100101 Firefox/133.0').expect(200);
    expect(res.headers['content-type']).toMatch(/^application\/json; charset=utf-8/);
    // RFC 6266 §4.1 with the RFC 8187 name form, as every download of the API.
    expect(res.headers['content-disposition']).toBe(`attachment; filename*=UTF-8''starledger-account-${at.slice(0, 10)}.json`);
    expect(res.headers['cache-control']).toBe('no-store');

    const file = accountExportSchema.strict().parse(res.body);
    expect(file.exportedAt).toBe(at);
    expect(file.account).toEqual({ id: userIds.observer, email: 'observer@test.invalid', name: 'Test observer', isSiteAdmin: false, secondFactor: false });
    expect(file.memberships).toEqual([{ projectId: world.projectId, projectCode: 'TEST', projectName: 'Test programme', role: 'observer' }]);
    expect(file.sessions).toHaveLength(1);
    expect(file.sessions[0]).toMatchObject({ current: true, address: expect.stringMatching(/127\.0\.0\.1|::1/) });
    expect(file.mailPreferences).toEqual([expect.objectContaining({ projectId: world.projectId, weeklySummary: true })]);
    expect(file.tokens).toEqual([{ name: 'Nightly pipeline', createdAt: at, lastUsedAt: null, expiresAt: '2027-03-01T00:00:00.000Z', revokedAt: null }]);
    expect(file.trail.map((e) => [e.action, e.actor?.id, e.targetDesignation, e.projectCode])).toEqual([['target.created', userIds.observer, 'Obs 7', 'TEST']]);
    expect(res.text).not.toContain('Lead 9');
    expect(res.text).not.toContain('Lead’s own token');
  });

  it('holds no credential: no password hash, token hash or prefix, second-factor secret, recovery code or session id', async () => {
    world = await makeWorld();
    const { db, userIds } = world;

    await db('recovery_codes').insert({ user_id: userIds.reader, code_hash: 'a'.repeat(64), created_at: world.clock.now().toISOString() });
    await db('api_tokens').insert({ user_id: userIds.reader, name: 'Reader script', token_hash: 'b'.repeat(64), prefix: 'slt_reader', created_at: world.clock.now().toISOString(), expires_at: '2027-03-01T00:00:00.000Z' });
    const reader = await signIn(world.app, 'reader');
    // Turned on after signing in (this session passed no code; it need not have): what is stored must not come out.
    const secret = 'sealed-second-factor-secret-of-the-reader';
    await db('users').where({ id: userIds.reader }).update({ totp_secret: secret, totp_enabled_at: world.clock.now().toISOString() });
    const res = await reader.agent.get('/api/account/export').expect(200);

    const stored = await db('users').where({ id: userIds.reader }).first('password_hash');
    const sessions = await db('sessions').where({ user_id: userIds.reader }).select('sid');
    const listedIds = (await reader.agent.get('/api/auth/sessions').expect(200)).body.sessions.map((s: { id: string }) => s.id);
    expect(sessions.length).toBe(1);
    for (const credential of [stored.password_hash, secret, 'a'.repeat(64), 'b'.repeat(64), 'slt_reader', sessions[0].sid, ...listedIds]) {
      expect(res.text).not.toContain(credential);
    }
    expect(res.text).not.toMatch(/"(passwordHash|password_hash|tokenHash|token_hash|prefix|totpSecret|secret|codeHash|sid)"\s*:/);
    expect(res.body.account.secondFactor).toBe(true);
  });

  it('is refused 401 without a session or token', async () => {
    world = await makeWorld();
    const res = await request(world.app).get('/api/account/export').expect(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});
