import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { demoAccounts } from '../../seeds/01-demo-scenario';
import { freePort } from './support/harness';

const root = path.resolve(import.meta.dirname, '../..');
let child: ChildProcess | undefined;
let checkout: string | undefined;
afterEach(async () => {
  if (child && child.exitCode === null) {
    // npm runs the server as its own child: end the whole process group the test started.
    const exited = new Promise((r) => child!.once('exit', r));
    process.kill(-child.pid!, 'SIGTERM');
    await exited;
  }
  if (checkout) fs.rmSync(checkout, { recursive: true, force: true });
  child = checkout = undefined;
});

// OWASP ASVS 4.0.3 14.1.4 (docs/security.md): the application can be deployed again from its repository by one script.
describe('a deployment from the repository alone', () => {
  it('npm start in a fresh export of the committed tree builds the client and server, migrates an empty database, seeds the demo and serves it (ASVS 14.1.4)', { timeout: 600_000 }, async () => {
    // The committed tree, as git has it (no build output, no data, nothing from a working copy), with the installed packages beside it.
    checkout = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-redeploy-'));
    execFileSync('sh', ['-c', `git archive HEAD | tar -x -C "${checkout}"`], { cwd: root });
    fs.symlinkSync(path.join(root, 'node_modules'), path.join(checkout, 'node_modules'));
    for (const made of ['dist', 'build', 'data']) expect(fs.existsSync(path.join(checkout, made)), made).toBe(false);

    const dataDir = path.join(checkout, 'data');
    const PORT = await freePort();
    child = spawn('npm', ['start'], {
      cwd: checkout,
      env: { ...process.env, PORT: String(PORT), HOST: '127.0.0.1', DATA_DIR: dataDir, DATABASE_URL: '', SMTP_URL: '', SESSION_SECRET: '', PASSWORD_PEPPER: '' },
      stdio: ['ignore', 'pipe', 'pipe'],
      detached: true,
    });
    let output = '';
    await new Promise<void>((resolve, reject) => {
      const onData = (chunk: Buffer) => {
        output += chunk.toString();
        if (output.includes('Starledger is running')) resolve();
      };
      child!.stdout!.on('data', onData);
      child!.stderr!.on('data', onData);
      child!.on('exit', (code) => reject(new Error(`npm start exited with ${code}:\n${output}`)));
    });

    for (const made of ['dist/index.html', 'build/server.js']) expect(fs.existsSync(path.join(checkout, made)), made).toBe(true);
    const base = `http://127.0.0.1:${PORT}`;
    const page = await fetch(`${base}/sign-in`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('<div id="root">');
    expect((await fetch(`${base}/api/auth/me`)).status).toBe(401);
    const observer = demoAccounts.find((a) => a.role === 'observer')!;
    const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: observer.email, password: observer.password }) });
    expect(login.status).toBe(200);
    const projects = await fetch(`${base}/api/projects`, { headers: { Cookie: login.headers.getSetCookie()[0].split(';')[0] } });
    expect(projects.status).toBe(200);
    expect(JSON.stringify(await projects.json())).toContain('GLASSWING');
  });
});
