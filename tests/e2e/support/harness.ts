import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { demoAccounts } from '../../../seeds/01-demo-scenario';
import { newTestDatabase } from '../../support/test-database';

const root = path.resolve(import.meta.dirname, '../../..');
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const chromiumAvailable = fs.existsSync(CHROMIUM);
export const shotsDir = path.join(root, 'tests/e2e/screenshots');

if (!chromiumAvailable) {
  if (process.env.CI) throw new Error(`Browser tests need Chromium at ${CHROMIUM}; .ci/run installs it with apt-get.`);
  console.warn(`\n*** SKIPPING BROWSER TESTS: no Chromium at ${CHROMIUM} (apt-get install -y chromium). ***\n`);
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export interface RunningApp {
  baseUrl: string;
  /** The server's process id (the outbox worker names its claims with it). */
  pid: number;
  stop(): Promise<void>;
}

export interface AppOptions {
  /** The database to run on; when omitted a fresh one, dropped at stop: a SQLite file in the app's data folder, or under TEST_DATABASE a PostgreSQL database (tests/support/test-database.ts). */
  databaseUrl?: string;
  /** More environment for the server, such as SMTP_URL. */
  env?: Record<string, string>;
}

/**
 * Runs the production build (dist/ and build/server.js, made by `npm test`
 * before this project runs) on a fresh database with the demo scenario, as
 * `npm start` would.
 */
export async function startApp(options: AppOptions = {}): Promise<RunningApp> {
  const serverJs = path.join(root, 'build/server.js');
  if (!fs.existsSync(serverJs) || !fs.existsSync(path.join(root, 'dist/index.html'))) {
    throw new Error('Run `npm run build` before the browser tests (npm test does).');
  }
  const port = await freePort();
  fs.mkdirSync(path.join(root, 'data'), { recursive: true });
  const dataDir = fs.mkdtempSync(path.join(root, 'data', 'e2e-'));
  const database = options.databaseUrl ? undefined : await newTestDatabase(`file:${path.join(dataDir, 'e2e.sqlite')}`);
  const child: ChildProcess = spawn(process.execPath, [serverJs], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      DATA_DIR: dataDir,
      DATABASE_URL: options.databaseUrl ?? database!.url,
      CLIENT_DIR: path.join(root, 'dist'),
      SESSION_SECRET: 'e2e-secret',
      NODE_ENV: 'production',
      SEED_DEMO: 'true',
      // As `npm start` runs the demo (README); a test that wants the rule passes ADMIN_SECOND_FACTOR=required in env.
      ADMIN_SECOND_FACTOR: 'optional',
      ...options.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${output}`)), 30_000);
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      if (output.includes('Starledger is running')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code) => reject(new Error(`server exited with ${code}:\n${output}`)));
  });
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    pid: child.pid!,
    async stop() {
      child.kill('SIGTERM');
      await new Promise((r) => child.once('exit', r));
      await database?.drop();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Chromium with a fresh profile (playwright makes one per launch under TMPDIR). */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(shotsDir, { recursive: true });
  const file = path.join(shotsDir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

export async function signInAs(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel(/e-mail/i).fill(email);
  await page.getByLabel(/password/i).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/**
 * One app and one browser for a describe block: started before its tests,
 * stopped after. `pageAs` opens a fresh context signed in as a demo account.
 */
export function browserSuite() {
  let app: RunningApp;
  let browser: Browser;
  beforeAll(async () => {
    app = await startApp();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });
  return {
    baseUrl: () => app.baseUrl,
    newPage: async () => (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage(),
    async pageAs(email: string): Promise<Page> {
      const account = demoAccounts.find((a) => a.email === email);
      if (!account) throw new Error(`no demo account ${email}`);
      const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
      await signInAs(page, app.baseUrl, email, account.password);
      return page;
    },
  };
}
