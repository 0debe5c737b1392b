/**
 * `npm run bench:api [-- --duration S --connections C --sizes 10000,100000 --only NAME --cpu-prof DIR]`:
 * autocannon against the production server (build/server.js) on loopback,
 * read through an API token as a pipeline would, for a project of 10 000
 * and one of 100 000 targets seeded straight into a bench database: the
 * 50-row target list (by designation and by right ascension), one target,
 * its derived values and the review queue. Beside them the ceiling: a bare
 * Express route answering a small JSON document, in its own process on the
 * same machine; and the floor: the same 50-row list with its SQL prepared
 * once under bare Express and better-sqlite3 (scripts/bench-api-floor.mjs),
 * what any implementation on this database pays. Prints requests per
 * second, p50/p99 latency, errors, each route's share of the ceiling and the
 * list's share of its floor.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import autocannon from 'autocannon';
import { createDb, migrateLatest } from '../server/db/knex';
import { bulkInsert } from '../server/db/bulk-insert';
import { seedMemberWithToken } from './seed-support';

const argument = (name: string, fallback: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const DURATION_S = Number(argument('duration', '10'));
const CONNECTIONS = Number(argument('connections', '100'));
const SIZES = argument('sizes', '10000,100000').split(',').map(Number);
/** Only the routes whose name contains this (e.g. `--only list`). */
const ONLY = argument('only', '');
/** `--cpu-prof DIR`: the server runs under node --cpu-prof and leaves one profile per size in DIR (open it in Chrome's DevTools). */
const CPU_PROF_DIR = argument('cpu-prof', '');
const APP_PORT = Number(process.env.BENCH_APP_PORT ?? 3140);
const BARE_PORT = Number(process.env.BENCH_BARE_PORT ?? 5240);
const FLOOR_PORT = Number(process.env.BENCH_FLOOR_PORT ?? 5241);
const root = path.resolve(import.meta.dirname, '..');
const TOKEN = 'slt_bench-api-token-for-the-load-benchmark-only';

/** A project of `targets` targets, each with approved temperature, luminosity, radius and distance, every tenth with a proposed second temperature. */
async function seed(file: string, targets: number): Promise<void> {
  const db = createDb(`file:${file}`);
  await migrateLatest(db);
  const at = '2026-12-01T00:00:00.000Z';
  await db.transaction(async (trx) => {
    const { projectId } = await seedMemberWithToken(trx, { email: 'lead@bench.invalid', role: 'lead', token: TOKEN, code: 'BENCH' });
    const rows = Array.from({ length: targets }, (_, i) => ({
      project_id: projectId,
      designation: `BENCH ${i + 1}`,
      designation_key: `bench${i + 1}`,
      // Right ascensions scattered over the sky, so that sorting by them is real work.
      ra_deg: ((i * 7919) % 3_600_000) / 10_000,
      dec_deg: ((i * 104_729) % 1_700_000) / 10_000 - 85,
      notes: '',
      tags: '[]',
      created_at: at,
      updated_at: at,
    }));
    await bulkInsert(trx, 'targets', rows);
    const base = { project_id: projectId, method: 'bench', method_label: 'bench', inputs_json: '[]', constants_json: '[]', warnings_json: '[]', review_note: '', created_at: at };
    const values: Record<string, unknown>[] = [];
    for (let id = 1; id <= targets; id++) {
      for (const [quantity, value, unit] of [
        ['temperature', 5000 + (id % 3000), 'K'],
        ['luminosity', 3.8e26 * (1 + (id % 50) / 10), 'W'],
        ['radius', 7e8 * (1 + (id % 20) / 10), 'm'],
        ['distance_parallax', 3.0857e17 * (1 + (id % 100)), 'm'],
      ] as const) {
        values.push({ ...base, target_id: id, quantity, value, uncertainty: value / 50, unit, revision: 1, status: 'approved' });
      }
      if (id % 10 === 0) values.push({ ...base, target_id: id, quantity: 'temperature', value: 5100 + (id % 3000), uncertainty: 100, unit: 'K', revision: 2, status: 'proposed' });
    }
    await bulkInsert(trx, 'derived_values', values);
  });
  await db.destroy();
}

function waitFor(child: ChildProcess, text: string): Promise<void> {
  return new Promise((resolve, reject) => {
    child.stdout!.on('data', (c: Buffer) => c.toString().includes(text) && resolve());
    child.on('exit', (code) => reject(new Error(`exited with ${code} before saying "${text}"`)));
  });
}

async function startApp(dir: string): Promise<ChildProcess> {
  const profiling = CPU_PROF_DIR ? ['--cpu-prof', '--cpu-prof-dir', path.resolve(CPU_PROF_DIR)] : [];
  const server = spawn(process.execPath, [...profiling, 'build/server.js'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'production', PORT: String(APP_PORT), DATA_DIR: dir, DATABASE_URL: `file:${path.join(dir, 'db.sqlite')}`, SESSION_SECRET: 'bench', SEED_DEMO: 'false' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await waitFor(server, 'running');
  return server;
}

/** The ceiling: Express with nothing but JSON, in its own process like the server. */
async function startBare(): Promise<ChildProcess> {
  const code = `
    const express = require('express');
    const app = express();
    app.get('/bare', (_req, res) => res.json({ id: 1, designation: 'BENCH 1', raDeg: 10.5, decDeg: -5.25 }));
    app.listen(${BARE_PORT}, '127.0.0.1', () => console.log('bare running'));
  `;
  const bare = spawn(process.execPath, ['-e', code], { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] });
  await waitFor(bare, 'running');
  return bare;
}

interface Figures {
  name: string;
  rps: number;
  p50: number;
  p99: number;
  errors: number;
  /** The errors by kind, for the goal's report. */
  kinds?: string;
}

/** The floor: the target list's SQL prepared once under plain Express (scripts/bench-api-floor.mjs), on the same database. */
async function startFloor(file: string): Promise<ChildProcess> {
  const floor = spawn(process.execPath, ['scripts/bench-api-floor.mjs', String(FLOOR_PORT), file], { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] });
  await waitFor(floor, 'running');
  return floor;
}

/** Until the server answers one request briskly: requests left queued by the previous route must not count against the next. */
async function idle(url: string): Promise<void> {
  for (let i = 0; i < 100; i++) {
    const t = performance.now();
    await fetch(url, { headers: { authorization: `Bearer ${TOKEN}` } }).then((r) => r.arrayBuffer());
    if (performance.now() - t < 100) return;
  }
}

async function measure(name: string, url: string): Promise<Figures> {
  await idle(url);
  const result = await autocannon({ url, connections: CONNECTIONS, duration: DURATION_S, headers: { authorization: `Bearer ${TOKEN}` } });
  // autocannon counts a timeout among its errors (it prints "N errors (M timeouts)"); answers that are not 2xx come apart.
  return {
    name,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    errors: result.errors + result.non2xx,
    kinds: `${result.timeouts} timed out (no answer in autocannon's 10 s), ${result.errors - result.timeouts} other connection errors, ${result.non2xx} answers not 2xx`,
  };
}

function print(rows: Figures[], ceiling: Figures) {
  const pad = (s: string, n: number) => s.padEnd(n);
  console.log(`  ${pad('route', 44)}${pad('req/s', 10)}${pad('p50 ms', 9)}${pad('p99 ms', 9)}${pad('errors', 9)}of ceiling`);
  for (const r of [ceiling, ...rows]) {
    const share = r === ceiling ? '100 %' : `${((100 * r.rps) / ceiling.rps).toFixed(1)} %`;
    console.log(`  ${pad(r.name, 44)}${pad(r.rps.toFixed(0), 10)}${pad(String(r.p50), 9)}${pad(String(r.p99), 9)}${pad(String(r.errors), 9)}${share}`);
  }
}

console.log(`Starledger API load: autocannon, ${CONNECTIONS} connections, ${DURATION_S} s per route, production bundle on 127.0.0.1:${APP_PORT}`);
execFileSync('npm', ['run', 'build:server', '--silent'], { cwd: root, stdio: 'inherit' });
const bare = await startBare();
const ceiling = await measure('bare Express route (ceiling)', `http://127.0.0.1:${BARE_PORT}/bare`);
const failures: string[] = [];
try {
  for (const size of SIZES) {
    const dir = path.join(root, 'data', `bench-api-${size}`);
    fs.rmSync(dir, { recursive: true, force: true });
    fs.mkdirSync(dir, { recursive: true });
    const t0 = performance.now();
    await seed(path.join(dir, 'db.sqlite'), size);
    console.log(`\n${size.toLocaleString('en')} targets (seeded in ${((performance.now() - t0) / 1000).toFixed(1)} s):`);
    const floor = await startFloor(path.join(dir, 'db.sqlite'));
    const floorList = await measure('floor: the list\'s SQL under bare Express', `http://127.0.0.1:${FLOOR_PORT}/api/projects/1/targets`);
    floor.kill('SIGTERM');
    const app = await startApp(dir);
    try {
      const p = `http://127.0.0.1:${APP_PORT}/api/projects/1`;
      const middle = Math.ceil(size / 2);
      const rows: Figures[] = [];
      for (const [name, url] of [
        ['target list, 50 rows by designation', `${p}/targets?pageSize=50`],
        ['target list, 50 rows by right ascension', `${p}/targets?pageSize=50&sort=raDeg`],
        ['one target', `${p}/targets/${middle}`],
        ['its derived values', `${p}/targets/${middle}/derived`],
        ['review queue', `${p}/review-queue`],
      ] as const) {
        if (name.includes(ONLY)) rows.push(await measure(name, url));
      }
      print([floorList, ...rows], ceiling);
      const list = rows.find((r) => r.name.endsWith('by designation'));
      if (list) console.log(`  the target list is ${((100 * list.rps) / floorList.rps).toFixed(0)} % of its floor`);
      for (const r of rows) {
        if (r.errors > 0) failures.push(`${size}: ${r.name}: ${r.errors} errors: ${r.kinds}`);
        if (r.p99 > 50) failures.push(`${size}: ${r.name}: p99 ${r.p99} ms > 50 ms`);
        if (r.rps < 0.4 * ceiling.rps) failures.push(`${size}: ${r.name}: ${((100 * r.rps) / ceiling.rps).toFixed(1)} % < 40 % of the ceiling`);
      }
    } finally {
      app.kill('SIGTERM');
      await new Promise((r) => app.once('exit', r));
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }
} finally {
  bare.kill('SIGTERM');
}
console.log(failures.length ? `\nShort of the goal (≥ 40 % of the ceiling, p99 ≤ 50 ms, 0 errors):\n  ${failures.join('\n  ')}` : '\nEvery route within the goal.');
