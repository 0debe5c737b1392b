import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDb } from '../../server/db/knex';
import { newTestDatabase, type TestDatabase } from '../support/test-database';

const root = path.resolve(import.meta.dirname, '../..');
let dir: string | undefined;
let database: TestDatabase | undefined;
afterEach(async () => {
  await database?.drop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
  dir = database = undefined;
});

/** `npm run admin:create` as an operator runs it, with the password piped in on standard input. */
function adminCreate(url: string, args: string[], password: string) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'scripts/admin-create.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    input: `${password}\n`,
    timeout: 60_000,
    env: { ...process.env, DATABASE_URL: url, DATA_DIR: dir, PASSWORD_PEPPER: '', SEED_DEMO: '' },
  });
}

describe('npm run admin:create: the first site admin of a database without the demo (ASVS 2.5.4)', () => {
  it('refuses a weak password naming the field, makes a site admin from a good one with the pepper kept in DATA_DIR, and refuses the same address twice', async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-admin-'));
    database = await newTestDatabase(`file:${path.join(dir, 'db.sqlite')}`);
    const args = ['--email', 'First.Admin@Example.invalid', '--name', 'Mireille Stavros'];

    // "password1234" is in the OWASP SecLists top list that fxa-common-password-list is drawn from.
    const common = adminCreate(database.url, args, 'password1234');
    expect(common.status).toBe(1);
    expect(common.stderr).toMatch(/^password: This is one of the most common passwords/m);
    const short = adminCreate(database.url, args, 'short');
    expect(short.status).toBe(1);
    expect(short.stderr).toMatch(/^password: Use at least 12 characters/m);
    const noEmail = adminCreate(database.url, ['--name', 'Mireille Stavros'], 'the dome at first light');
    expect(noEmail.status).toBe(2);
    expect(noEmail.stderr).toMatch(/--email ADDRESS/);

    const made = adminCreate(database.url, args, 'the dome at first light');
    expect(made.stderr).toBe('');
    expect(made.status).toBe(0);
    expect(made.stdout).toMatch(/Made site admin first\.admin@example\.invalid \(Mireille Stavros\)/);
    const pepper = fs.readFileSync(path.join(dir, 'password-pepper'), 'utf8').trim();
    expect(pepper).toMatch(/^[0-9a-f]{64}$/);

    const twice = adminCreate(database.url, args, 'the dome at first light');
    expect(twice.status).toBe(1);
    expect(twice.stderr).toMatch(/^email: Already in use/m);

    const db = createDb(database.url);
    try {
      const rows = await db('users').select('email', 'is_site_admin', 'must_change_password', 'password_hash');
      expect(rows).toHaveLength(1);
      expect(Boolean(rows[0].is_site_admin)).toBe(true);
      expect(rows[0].password_hash.startsWith('scrypt-hmac$')).toBe(true);
      const app = createApp({ db, sessionSecret: 'test-secret', sessionCleanupIntervalMs: 0, passwordPepper: pepper });
      const login = await request(app).post('/api/auth/login').send({ email: 'first.admin@example.invalid', password: 'the dome at first light' }).expect(200);
      // The owner typed it, so nothing is asked to change.
      expect(login.body.user).toMatchObject({ isSiteAdmin: true, mustChangePassword: null });
    } finally {
      await db.destroy();
    }
  }, 120_000);
});

describe('the server without SEED_DEMO (ASVS 2.5.4, 14.2.2)', () => {
  it('makes no accounts in an empty database and says how to make the first site admin', async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-nodemo-'));
    database = await newTestDatabase(`file:${path.join(dir, 'db.sqlite')}`, { migrated: false });
    const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_URL: database.url, DATA_DIR: dir, PORT: '0', SESSION_SECRET: 'test', SMTP_URL: 'smtp://127.0.0.1:9', MAIL_WORKER: 'false' };
    delete env.SEED_DEMO;
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    await new Promise<void>((resolve, reject) => {
      const onData = (chunk: Buffer) => {
        output += chunk.toString();
        if (output.includes('Starledger is running')) resolve();
      };
      child.stdout.on('data', onData);
      child.stderr.on('data', onData);
      child.on('exit', (code) => reject(new Error(`server exited with ${code}:\n${output}`)));
    });
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
    expect(output).not.toMatch(/Seeded the demo/);
    expect(output).toMatch(/No accounts yet\. Make the first site admin with: npm run admin:create -- --email/);
    const db = createDb(database.url);
    try {
      expect(Number((await db('users').count({ n: '*' }).first())!.n)).toBe(0);
      expect(Number((await db('projects').count({ n: '*' }).first())!.n)).toBe(0);
    } finally {
      await db.destroy();
    }
  }, 90_000);
});
