/**
 * `npm run bench:upload`: 100 000 long-format rows over 10 000 targets,
 * uploaded and committed through the API of a real server process, against
 * the floor of the same rows inserted by bare better-sqlite3 prepared
 * statements in one transaction. Prints wall times, rows per second, the
 * ratio, and the server's peak resident memory (VmHWM).
 */
import { execFileSync, spawn } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDb, migrateLatest } from '../server/db/knex';

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const TARGETS = Number(process.env.BENCH_TARGETS ?? 10_000);
const root = path.resolve(import.meta.dirname, '..');
const dir = fs.mkdtempSync(path.join(root, 'data', 'bench-'));

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

function makeFile(): string {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,band,rest_wavelength,lande_g,observed_at'];
  const perTarget = Math.ceil(ROWS / TARGETS);
  for (let r = 0; r < ROWS; r++) {
    const t = Math.floor(r / perTarget);
    const first = r % perTarget === 0;
    // In whole units of 0.0001°, so that rounding can never print 360.0000 (RA lies in [0°, 360°)).
    const ra = first ? (((t * 360) % 3_600_000) / 10_000).toFixed(4) : '';
    const dec = first ? (((t * 170) % 1_700_000) / 10_000 - 85).toFixed(4) : '';
    lines.push(`BENCH ${t},${ra},${dec},${QUANTITIES[r % perTarget % QUANTITIES.length](r)},2026-11-30T22:00:00Z`);
  }
  return lines.join('\n') + '\n';
}

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

function peakRssMb(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmHWM:\s+(\d+)/.exec(status)![1]) / 1024;
}

async function throughApi(file: string) {
  const port = await freePort();
  // The production bundle, as `npm start` runs it.
  execFileSync('npm', ['run', 'build:server', '--silent'], { cwd: root, stdio: 'ignore' });
  const server = spawn(process.execPath, [...(process.env.BENCH_NODE_OPTIONS?.split(' ') ?? []), 'build/server.js'], {
    cwd: root,
    env: { ...process.env, PORT: String(port), DATA_DIR: dir, DATABASE_URL: `file:${path.join(dir, 'api.sqlite')}`, SESSION_SECRET: 'bench', SEED_DEMO: 'true' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve) => server.stdout!.on('data', (c: Buffer) => c.toString().includes('running') && resolve()));
  const base = `http://127.0.0.1:${port}/api`;
  const login = await fetch(`${base}/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ email: 'observer@demo.invalid', password: 'observer-demo-2026' }) });
  const cookie = login.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  const tokenRes = await fetch(`${base}/tokens`, { method: 'POST', headers: { 'Content-Type': 'application/json', Cookie: cookie, 'X-CSRF-Token': csrfToken }, body: JSON.stringify({ name: 'bench' }) });
  const { token } = (await tokenRes.json()) as { token: string };
  const auth = { Authorization: `Bearer ${token}` };

  const t0 = performance.now();
  const form = new FormData();
  form.append('file', new Blob([file], { type: 'text/csv' }), 'bench.csv');
  const up = await fetch(`${base}/projects/1/uploads`, { method: 'POST', headers: auth, body: form });
  const { upload } = (await up.json()) as { upload: { id: number; errorCount: number; errors: unknown[] } };
  if (upload.errorCount) throw new Error(`bench file has errors: ${JSON.stringify(upload.errors.slice(0, 3))}`);
  const t1 = performance.now();
  const commit = await fetch(`${base}/projects/1/uploads/${upload.id}/commit`, { method: 'POST', headers: { ...auth, 'Content-Type': 'application/json' }, body: '{}' });
  const result = (await commit.json()) as { measurementsAdded: number; derivedProposed: number };
  const t2 = performance.now();
  const rss = peakRssMb(server.pid!);
  server.kill('SIGTERM');
  return { previewMs: t1 - t0, commitMs: t2 - t1, result, rss };
}

async function floor(file: string) {
  const url = path.join(dir, 'floor.sqlite');
  const knex = createDb(`file:${url}`);
  await migrateLatest(knex);
  await knex('projects').insert({ code: 'B', name: 'B', description: '', site_name: 's', site_latitude_deg: 0, site_longitude_deg: 0, site_elevation_m: 0, site_time_zone: 'Etc/UTC', created_at: 'x', updated_at: 'x' });
  await knex.destroy();
  const db = new Database(url);
  db.pragma('journal_mode = WAL');
  const lines = file.trim().split('\n').slice(1);
  const t0 = performance.now();
  const insertTarget = db.prepare("INSERT INTO targets (project_id, designation, designation_key, ra_deg, dec_deg, notes, tags, created_at, updated_at) VALUES (1, ?, ?, ?, ?, '', '[]', 'x', 'x')");
  const insertMeasurement = db.prepare(
    "INSERT INTO measurements (project_id, target_id, row_number, kind, value_si, uncertainty_si, unit_si, value_as_sent, uncertainty_as_sent, unit_as_sent, band, note, extra_json, created_at) VALUES (1, ?, ?, ?, ?, ?, 'x', ?, ?, ?, ?, '', '{}', 'x')",
  );
  const ids = new Map<string, number | bigint>();
  db.transaction(() => {
    lines.forEach((line, i) => {
      const [target, ra, dec, kind, value, unc, unit, band] = line.split(',');
      let id = ids.get(target);
      if (id === undefined) {
        id = insertTarget.run(target, target.toLowerCase(), Number(ra), Number(dec)).lastInsertRowid;
        ids.set(target, id);
      }
      insertMeasurement.run(id, i + 2, kind, Number(value), Number(unc), Number(value), Number(unc), unit, band || null);
    });
  })();
  const ms = performance.now() - t0;
  db.close();
  return ms;
}

const file = makeFile();
console.log(`Starledger upload benchmark: ${ROWS.toLocaleString('en')} rows over ${TARGETS.toLocaleString('en')} targets (${(file.length / 1e6).toFixed(1)} MB)`);
const api = await throughApi(file);
const floorMs = await floor(file);
const totalMs = api.previewMs + api.commitMs;
console.log(`upload + preview:   ${(api.previewMs / 1000).toFixed(2)} s`);
console.log(`commit + derive:    ${(api.commitMs / 1000).toFixed(2)} s (${api.result.measurementsAdded} measurements, ${api.result.derivedProposed} derived values proposed)`);
console.log(`total through API:  ${(totalMs / 1000).toFixed(2)} s, ${Math.round(ROWS / (totalMs / 1000)).toLocaleString('en')} rows/s`);
console.log(`floor (bare better-sqlite3, one transaction): ${(floorMs / 1000).toFixed(2)} s, ${Math.round(ROWS / (floorMs / 1000)).toLocaleString('en')} rows/s`);
console.log(`ratio API / floor:  ${(totalMs / floorMs).toFixed(1)}×`);
console.log(`server peak memory: ${api.rss.toFixed(0)} MB (VmHWM)`);
fs.rmSync(dir, { recursive: true, force: true });
