import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { emails, makeWorld, PASSWORD, type World } from '../support/world';

let current: World | undefined;
afterEach(async () => current?.db.destroy());

const PEPPER = '5f1e0c7d9a2b48e6b3c1d0a9f8e7d6c55f1e0c7d9a2b48e6b3c1d0a9f8e7d6c5';

describe('password hashes with a pepper (ASVS 2.4.5)', () => {
  it('a hash from before the pepper signs in, is made again with the pepper at that sign-in, and then signs in only where the pepper is', async () => {
    const w = (current = await makeWorld());
    const peppered = createApp({ db: w.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, passwordPepper: PEPPER, adminSecondFactor: 'optional' });
    const plain = createApp({ db: w.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0 });
    const hashOf = async () => (await w.db('users').where({ id: w.userIds.lead }).first()).password_hash as string;
    const before = await hashOf();
    expect(before.startsWith('scrypt$')).toBe(true);

    const first = request.agent(peppered);
    await first.post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    const after = await hashOf();
    expect(after.startsWith('scrypt-hmac$')).toBe(true);
    // The session just opened carries the new hash's stamp, so it goes on.
    await first.get('/api/projects').expect(200);

    await request(peppered).post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(200);
    expect(await hashOf()).toBe(after);
    await request(peppered).post('/api/auth/login').send({ email: emails.lead, password: 'not-the-password' }).expect(401);
    // Without the pepper the database alone does not let the password in.
    await request(plain).post('/api/auth/login').send({ email: emails.lead, password: PASSWORD }).expect(401);
    // An account not yet signed in keeps its old hash and signs in either way.
    await request(plain).post('/api/auth/login').send({ email: emails.reader, password: PASSWORD }).expect(200);
  }, 30_000);

  it('a password set where the pepper is, by a new account, is peppered from the start', async () => {
    const w = (current = await makeWorld());
    const peppered = createApp({ db: w.db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, passwordPepper: PEPPER, adminSecondFactor: 'optional' });
    const admin = request.agent(peppered);
    const csrf = (await admin.post('/api/auth/login').send({ email: emails.admin, password: PASSWORD }).expect(200)).body.csrfToken as string;
    await admin.post('/api/users').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, email: 'ivo.brandt@test.invalid', name: 'Ivo Brandt', password: 'chosen for the first night' }).expect(201);
    const row = await w.db('users').where({ email: 'ivo.brandt@test.invalid' }).first();
    expect(row.password_hash.startsWith('scrypt-hmac$')).toBe(true);
  }, 30_000);
});
