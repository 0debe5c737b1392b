/**
 * `npm run fault:kill [-- --trials N --rows R]`: kills the production server
 * with SIGKILL at a random moment of a large commit, restarts it, and checks
 * that the database survived whole: `PRAGMA integrity_check` says ok, the
 * upload's measurements and the targets it creates are all there or none
 * (never part), its status agrees with what is there, and the restarted
 * server answers. The first commit runs to the end and times the window the
 * kills are drawn from. Exits 1 on any failed trial.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDb, migrateLatest } from '../server/db/knex';
import { seedMemberWithToken } from './seed-support';

const argument = (name: string, fallback: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const TRIALS = Number(argument('trials', '50'));
const ROWS = Number(argument('rows', '20000'));
const PER_TARGET = 10;
const PORT = Number(process.env.FAULT_PORT ?? 3140);
const root = path.resolve(import.meta.dirname, '..');
const dir = path.join(root, 'data', 'fault-kill');
const file = path.join(dir, 'db.sqlite');
const TOKEN = 'slt_fault-kill-token-for-the-crash-trials-only';
const base = `http://127.0.0.1:${PORT}/api`;
const auth = { Authorization: `Bearer ${TOKEN}` };

/** An observer with a token in one project, written straight into a fresh database. */
async function prepare(): Promise<void> {
  fs.rmSync(dir, { recursive: true, force: true });
  fs.mkdirSync(dir, { recursive: true });
  const db = createDb(`file:${file}`);
  await migrateLatest(db);
  await seedMemberWithToken(db, { email: 'observer@fault.invalid', role: 'observer', token: TOKEN, code: 'KILL' });
  await db.destroy();
}

/** ROWS rows of photometry and parallaxes over ROWS/10 targets new to the project, named after the trial. */
function makeFile(trial: number): string {
  const lines = ['target,ra,dec,quantity,value,uncertainty,unit,band'];
  for (let r = 0; r < ROWS; r++) {
    const t = Math.floor(r / PER_TARGET);
    const first = r % PER_TARGET === 0;
    const ra = first ? ((t * 0.0137) % 360).toFixed(4) : '';
    const dec = first ? (((t * 0.0071) % 170) - 85).toFixed(4) : '';
    const row = r % 3 === 0 ? `parallax,${(5 + (r % 400) / 10).toFixed(2)},0.3,mas,` : r % 3 === 1 ? `magnitude,${(6 + (r % 50) / 10).toFixed(2)},0.02,mag,V` : `colour_index,${(0.2 + (r % 120) / 100).toFixed(3)},0.02,mag,B-V`;
    lines.push(`K${trial}-${t},${ra},${dec},${row}`);
  }
  return lines.join('\n') + '\n';
}

function start(): Promise<ChildProcess> {
  const server = spawn(process.execPath, ['build/server.js'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'production', PORT: String(PORT), DATA_DIR: dir, DATABASE_URL: `file:${file}`, SESSION_SECRET: 'fault', SEED_DEMO: 'false', MAIL_WORKER: 'false' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let said = '';
  return new Promise((resolve, reject) => {
    server.stdout!.on('data', (c: Buffer) => {
      said += c.toString();
      if (said.includes('running')) resolve(server);
    });
    server.stderr!.on('data', (c: Buffer) => (said += c.toString()));
    server.once('exit', (code) => reject(new Error(`the server exited (${code}) before it was running:\n${said}`)));
  });
}

const exited = (server: ChildProcess) => new Promise((r) => (server.exitCode !== null || server.signalCode !== null ? r(null) : server.once('exit', r)));

async function previewed(trial: number): Promise<number> {
  const form = new FormData();
  form.append('file', new Blob([makeFile(trial)], { type: 'text/csv' }), `kill-${trial}.csv`);
  const res = await fetch(`${base}/projects/1/uploads`, { method: 'POST', headers: auth, body: form });
  const body = (await res.json()) as { upload?: { id: number; errorCount: number } };
  if (res.status !== 201 || !body.upload || body.upload.errorCount) throw new Error(`the trial file did not preview cleanly: ${res.status} ${JSON.stringify(body).slice(0, 300)}`);
  return body.upload.id;
}

const commit = (uploadId: number) => fetch(`${base}/projects/1/uploads/${uploadId}/commit`, { method: 'POST', headers: { ...auth, 'Content-Type': 'application/json' }, body: '{}' });

/** What the database holds of one trial, read straight from the file after the crash (opening it replays the WAL). */
function inspect(trial: number, uploadId: number) {
  const db = new Database(file);
  try {
    const integrity = (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join('; ');
    const measurements = (db.prepare('SELECT count(*) AS n FROM measurements WHERE upload_id = ?').get(uploadId) as { n: number }).n;
    const targets = (db.prepare("SELECT count(*) AS n FROM targets WHERE designation LIKE ? ESCAPE '\\'").get(`K${trial}-%`) as { n: number }).n;
    const status = (db.prepare('SELECT status FROM uploads WHERE id = ?').get(uploadId) as { status: string } | undefined)?.status;
    return { integrity, measurements, targets, status };
  } finally {
    db.close();
  }
}

console.log(`Starledger kill -9 trials: ${TRIALS} commits of ${ROWS.toLocaleString('en')} rows over ${(ROWS / PER_TARGET).toLocaleString('en')} new targets each, the server killed at a random moment of each`);
if (!process.argv.includes('--no-build')) execFileSync('npm', ['run', 'build:server', '--silent'], { cwd: root, stdio: 'ignore' });
await prepare();
let server = await start();

// The first commit runs to the end: it proves the file commits and times the window.
const firstId = await previewed(0);
const t0 = performance.now();
const firstRes = await commit(firstId);
const windowMs = performance.now() - t0;
if (firstRes.status !== 200) throw new Error(`the timing commit answered ${firstRes.status}: ${(await firstRes.text()).slice(0, 300)}`);
console.log(`a whole commit takes ${(windowMs / 1000).toFixed(2)} s; kills fall uniformly within it`);

const failures: string[] = [];
const outcomes = { none: 0, all: 0 };
for (let trial = 1; trial <= TRIALS; trial++) {
  const uploadId = await previewed(trial);
  const delay = Math.random() * windowMs;
  const answered = commit(uploadId).then(
    (r) => r.status,
    () => 'cut off',
  );
  await new Promise((r) => setTimeout(r, delay));
  server.kill('SIGKILL');
  await exited(server);
  const status = await answered;
  const seen = inspect(trial, uploadId);
  const whole = seen.measurements === ROWS && seen.targets === ROWS / PER_TARGET;
  const nothing = seen.measurements === 0 && seen.targets === 0;
  const problems: string[] = [];
  if (seen.integrity !== 'ok') problems.push(`integrity_check: ${seen.integrity}`);
  if (!whole && !nothing) problems.push(`partial: ${seen.measurements} of ${ROWS} measurements, ${seen.targets} of ${ROWS / PER_TARGET} targets`);
  if (whole !== (seen.status === 'committed')) problems.push(`upload status "${seen.status}" with ${seen.measurements} measurements`);
  if (status === 200 && !whole) problems.push('answered 200 but the rows are not there');
  server = await start();
  const answers = await fetch(`${base}/projects/1/uploads/${uploadId}`, { headers: auth });
  if (answers.status !== 200) problems.push(`after restart the app answered ${answers.status}`);
  if (whole) outcomes.all++;
  if (nothing) outcomes.none++;
  console.log(`trial ${String(trial).padStart(3)}: killed after ${delay.toFixed(0).padStart(5)} ms (${status}): ${whole ? 'all' : nothing ? 'none' : 'PART'}, status ${seen.status}, integrity ${seen.integrity}${problems.length ? `  ✗ ${problems.join('; ')}` : ''}`);
  if (problems.length) failures.push(`trial ${trial}: ${problems.join('; ')}`);
}
server.kill('SIGTERM');
await exited(server);
console.log(`\n${TRIALS} trials: ${outcomes.all} committed whole, ${outcomes.none} left nothing, ${TRIALS - outcomes.all - outcomes.none} partial; ${failures.length} failed`);
if (failures.length) {
  console.log(failures.join('\n'));
  process.exitCode = 1;
} else fs.rmSync(dir, { recursive: true, force: true });
