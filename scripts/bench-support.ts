/**
 * What the upload benchmarks share: the invented 100 000-row season over
 * 10 000 targets, and a production server on a free loopback port with the
 * demo seeded, signed in as a demo account.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';

export const root = path.resolve(import.meta.dirname, '..');

const QUANTITIES = [
  (i: number) => `magnitude,${(6 + (i % 50) / 10).toFixed(2)},0.02,mag,V,,`,
  (i: number) => `colour_index,${(0.2 + (i % 120) / 100).toFixed(3)},0.02,mag,B-V,,`,
  (i: number) => `parallax,${(5 + (i % 400) / 10).toFixed(2)},0.3,mas,,,`,
  (i: number) => `peak_wavelength,${400 + (i % 500)},5,nm,,,`,
  (i: number) => `extinction,${((i % 10) / 100).toFixed(2)},0.01,mag,,,`,
  (i: number) => `line_wavelength,${(656.28 + (i % 20) / 1000).toFixed(4)},0.004,nm,,656.279,`,
  (i: number) => `bolometric_flux,${(1e-9 * (1 + (i % 30))).toExponential(3)},1e-11,W/m2,,,`,
  (i: number) => `limb_separation,${(0.01 + (i % 9) / 1000).toFixed(4)},0.001,nm,,656.279,`,
  (i: number) => `zeeman_separation,${(0.005 + (i % 7) / 1000).toFixed(4)},0.001,nm,,630.25,2.5`,
  (i: number) => `magnitude,${(6.5 + (i % 40) / 10).toFixed(2)},0.02,mag,B,,`,
];

/** `rows` long-format rows over `targets` targets, each target's first row giving its position. */
export function makeFile(rows: number, targets: number): string {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,band,rest_wavelength,lande_g,observed_at'];
  const perTarget = Math.ceil(rows / targets);
  for (let r = 0; r < rows; r++) {
    const t = Math.floor(r / perTarget);
    const first = r % perTarget === 0;
    // In whole units of 0.0001°, so that rounding can never print 360.0000 (RA lies in [0°, 360°)).
    const ra = first ? (((t * 360) % 3_600_000) / 10_000).toFixed(4) : '';
    const dec = first ? (((t * 170) % 1_700_000) / 10_000 - 85).toFixed(4) : '';
    lines.push(`BENCH ${t},${ra},${dec},${QUANTITIES[r % perTarget % QUANTITIES.length](r)},2026-11-30T22:00:00Z`);
  }
  return lines.join('\n') + '\n';
}

export async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export interface BenchServer {
  base: string;
  process: ChildProcess;
  stop(): void;
}

/**
 * Builds the server bundle and starts it as `npm start` runs it, on its own
 * data folder: on a new SQLite file there, or on the (empty) PostgreSQL
 * database DATABASE_URL names when it is a `postgres://` URL.
 */
export async function startProductionServer(dir: string, nodeOptions: string[] = []): Promise<BenchServer> {
  const port = await freePort();
  execFileSync('npm', ['run', 'build:server', '--silent'], { cwd: root, stdio: 'ignore' });
  const server = spawn(process.execPath, [...nodeOptions, 'build/server.js'], {
    cwd: root,
    env: { ...process.env, PORT: String(port), DATA_DIR: dir, DATABASE_URL: process.env.DATABASE_URL?.startsWith('postgres') ? process.env.DATABASE_URL : `file:${path.join(dir, 'api.sqlite')}`, SESSION_SECRET: 'bench', SEED_DEMO: 'true' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve) => server.stdout!.on('data', (c: Buffer) => c.toString().includes('running') && resolve()));
  return { base: `http://127.0.0.1:${port}/api`, process: server, stop: () => server.kill('SIGTERM') };
}

/** Signs a demo account in: its session cookie and CSRF token. */
export async function signInAs(base: string, email: string, password: string): Promise<{ cookie: string; csrfToken: string }> {
  const login = await fetch(`${base}/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email, password }) });
  const cookie = login.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  return { cookie, csrfToken };
}
