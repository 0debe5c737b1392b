/**
 * `npm run bench:upload`: 100 000 long-format rows over 10 000 targets,
 * uploaded and committed through the API of a real server process, against
 * the floor of the same rows inserted by bare better-sqlite3 prepared
 * statements in one transaction. Prints wall times, rows per second, the
 * ratio, and the server's peak resident memory (VmHWM).
 */
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDb, migrateLatest } from '../server/db/knex';
import { makeFile, root, signInAs, startProductionServer } from './bench-support';

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const TARGETS = Number(process.env.BENCH_TARGETS ?? 10_000);
const dir = fs.mkdtempSync(path.join(root, 'data', 'bench-'));

function peakRssMb(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
  return Number(/VmHWM:\s+(\d+)/.exec(status)![1]) / 1024;
}

async function throughApi(file: string) {
  const { base, process: server } = await startProductionServer(dir, process.env.BENCH_NODE_OPTIONS?.split(' ') ?? []);
  const { cookie, csrfToken } = await signInAs(base, 'observer@demo.invalid', 'observer-demo-2026');
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

const file = makeFile(ROWS, TARGETS);
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
