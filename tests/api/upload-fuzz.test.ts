import v8 from 'node:v8';
import vm from 'node:vm';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World, PASSWORD } from '../support/world';

/**
 * Property-based fuzz of uploads: measurement files in every encoding,
 * delimiter and quoting a spreadsheet or a script might produce, with
 * numbers at the edges, huge fields, many columns and designations in any
 * script, and spectra of every size up to the upload limit. For each: never
 * a 5xx, never a partial import (the project's measurements and targets
 * grow by what a successful commit reports, or not at all), and no request
 * slower than a few seconds, and the server's heap back near where it
 * started once the run is over (nothing of the files kept in memory).
 *
 * FUZZ_RUNS sets the number of cases (`npm run fuzz` runs 10 000); the
 * normal test run takes 1 000 (about 35 s here), with spectra up
 * to 20 000 points rather than the 20 MB limit `npm run fuzz` reaches.
 */
const RUNS = Number(process.env.FUZZ_RUNS ?? 1000);
const FULL = RUNS >= 10_000;
const SLOWEST_MS = 5_000;
const MAX_SPECTRUM_POINTS = FULL ? 600_000 : 20_000;
/** What the heap may have grown by after the run, garbage collected: caches that are meant to stay (compiled code, prepared statements), not the files. */
const HEAP_GROWTH_ALLOWED = 64 * 1024 * 1024;

/** The JavaScript heap in use after a full collection (V8's gc, exposed for the test). */
function heapAfterCollection(): number {
  v8.setFlagsFromString('--expose-gc');
  const collect = vm.runInNewContext('gc') as () => void;
  collect();
  collect();
  return process.memoryUsage().heapUsed;
}

let world: World;
let auth: string;
beforeAll(async () => {
  world = await makeWorld();
  const { agent, csrf } = await signIn(world.app, 'observer');
  auth = `Bearer ${(await agent.post('/api/tokens').set('X-CSRF-Token', csrf).send({ currentPassword: PASSWORD, name: 'fuzz' }).expect(201)).body.token}`;
});
afterAll(async () => world?.db.destroy());

const edgeNumber = fc.oneof(
  fc.constantFrom('0', '-0', '1e308', '1e309', '-1e309', '5e-324', '1e-400', 'NaN', 'Infinity', '-Infinity', '', ' ', '-', '+', '.', '1,5', '1.5.5', '0x10', '1e', '١٢٣', '１２', '∞'),
  fc.double().map(String),
  fc.integer().map(String),
  fc.string({ unit: fc.constantFrom('0', '9', '.', 'e', '-', '+', ','), maxLength: 30 }),
  fc.nat(400).map((n) => '9'.repeat(n)),
);
const ra = fc.oneof(fc.constantFrom('0', '359.9999', '360', '-0.0001', '24h', '12 30 00', '12:30:00.5', '99 99 99'), fc.double({ min: -10, max: 400 }).map((x) => x.toFixed(4)));
const dec = fc.oneof(fc.constantFrom('90', '-90', '90.0001', '+45 30 00', '-00 00 01'), fc.double({ min: -100, max: 100 }).map((x) => x.toFixed(4)));
const designation = fc.oneof(
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 70 }),
  fc.constantFrom('HD 1', 'hd1', 'H D 1', 'α Cen', 'Größe-α', '天狼星', '🌟 1', 'x'.repeat(65), '=cmd|\' /C calc\'!A0', '"quoted"', 'a,b', 'line\nbreak'),
);
const quantity = fc.constantFrom('magnitude', 'colour_index', 'parallax', 'peak_wavelength', 'extinction', 'bolometric_flux', 'line_wavelength', 'nonsense', '', 'MAGNITUDE');
const unit = fc.constantFrom('mag', 'mas', 'nm', 'W/m2', 'angstrom', 'um', '', 'furlong');
const band = fc.constantFrom('V', 'B', 'B-V', 'R', '', 'Ω');
const hugeField = fc.nat(2_000_000).map((n) => 'h'.repeat(n));

const garbageRow = fc.tuple(designation, ra, dec, quantity, edgeNumber, edgeNumber, unit, band);
/** Rows a careful observer writes, so that many files commit and the all-or-nothing check has something to hold. */
const cleanRow = fc
  .tuple(fc.stringMatching(/^[A-Za-z0-9][A-Za-z0-9 .+_-]{0,20}$/), fc.double({ min: 0, max: 359.99, noNaN: true }), fc.double({ min: -89.99, max: 89.99, noNaN: true }), fc.integer({ min: 0, max: 2 }), fc.double({ min: 0.5, max: 30, noNaN: true }))
  .map(([name, r, d, k, v]): string[] => {
    const [q, u, b] = [['magnitude', 'mag', 'V'], ['parallax', 'mas', ''], ['colour_index', 'mag', 'B-V']][k];
    return [`F ${name}`, r.toFixed(4), d.toFixed(4), q, v.toPrecision(6), '0.02', u, b];
  });
const extraColumns = fc.nat(400);
const delimiter = fc.constantFrom(',', ';', '\t', '|');
const lineEnd = fc.constantFrom('\n', '\r\n', '\r');
const encoding = fc.constantFrom('utf8', 'utf8-bom', 'utf16le-bom', 'latin1');
const quoting = fc.constantFrom('none', 'all', 'needed');

function field(value: string, d: string, q: string): string {
  const needs = value.includes(d) || value.includes('"') || /[\r\n]/.test(value);
  if (q === 'all' || (q === 'needed' && needs)) return `"${value.replace(/"/g, '""')}"`;
  return value;
}

function encode(text: string, how: string): Buffer {
  if (how === 'utf8-bom') return Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text, 'utf8')]);
  if (how === 'utf16le-bom') return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
  if (how === 'latin1') return Buffer.from(text, 'latin1');
  return Buffer.from(text, 'utf8');
}

const measurementFile = fc
  .record({ rows: fc.oneof(fc.array(cleanRow, { minLength: 1, maxLength: 40 }), fc.array(fc.oneof(garbageRow, cleanRow), { minLength: 0, maxLength: 40 })), extra: extraColumns, d: delimiter, end: lineEnd, enc: encoding, q: quoting, huge: fc.option(hugeField, { freq: 8 }), header: fc.boolean() })
  .map(({ rows, extra, d, end, enc, q, huge, header }) => {
    const extras = Array.from({ length: extra }, (_, i) => `extra_${i}`);
    const head = header ? ['target', 'ra', 'dec', 'quantity', 'value', 'uncertainty', 'unit', 'band', ...extras] : [];
    const lines = head.length ? [head.map((h) => field(h, d, q)).join(d)] : [];
    rows.forEach((r, i) => {
      const cells = [...r, ...extras.map(() => '')];
      if (huge && i === 0) cells[cells.length > 8 ? 8 : 7] = huge;
      lines.push(cells.map((c) => field(c, d, q)).join(d));
    });
    return { kind: 'measurements' as const, bytes: encode(lines.join(end) + end, enc) };
  });

const spectrumFile = fc
  .record({ points: fc.nat(MAX_SPECTRUM_POINTS), header: fc.constantFrom('wavelength_nm,flux', 'wavelength_nm,flux,flux_err', 'wavelength,flux', 'λ (Å),flux'), noise: fc.double({ min: 0, max: 2, noNaN: true }), bad: fc.option(edgeNumber, { freq: 3 }) })
  .map(({ points, header, noise, bad }) => {
    const three = header.split(',').length === 3;
    const lines: string[] = [header];
    for (let i = 0; i < points; i++) {
      const nm = 300 + (700 * i) / Math.max(points, 1);
      const flux = (1 + noise * Math.sin(i * 12.9898)) / (nm / 500) ** 5 / (Math.exp(2.8978e6 / (nm * 5800)) - 1);
      lines.push(`${nm.toFixed(4)},${flux.toPrecision(6)}${three ? ',0.01' : ''}`);
    }
    if (bad !== null && points > 0) lines[1 + Math.floor(points / 2)] = `${bad},${bad}`;
    return { kind: 'spectrum' as const, points, bytes: Buffer.from(lines.join('\n') + '\n') };
  });

async function counts() {
  const m = await world.db('measurements').where({ project_id: world.projectId }).count({ n: '*' }).first();
  const t = await world.db('targets').where({ project_id: world.projectId }).count({ n: '*' }).first();
  return { measurements: Number(m!.n), targets: Number(t!.n) };
}

/** The slowest preview and commit seen, with the file they were of, for the figures printed after the run. */
const slowest: Record<'preview' | 'commit', { ms: number; file: string }> = { preview: { ms: 0, file: '' }, commit: { ms: 0, file: '' } };

async function timed<T>(what: 'preview' | 'commit', file: string, run: () => Promise<T>): Promise<T> {
  const started = performance.now();
  const result = await run();
  const ms = performance.now() - started;
  if (ms > slowest[what].ms) slowest[what] = { ms, file };
  if (ms > SLOWEST_MS) throw new Error(`the ${what} of ${file} took ${ms.toFixed(0)} ms`);
  return result;
}

/**
 * Lets go of what the cases stored (files, their rows and errors, spectra's
 * points) once each is checked, so that 10 000 cases with spectra up to the
 * size limit fit in memory (the in-memory database grew by about 0.8 GB a
 * minute); the checks count only measurements and targets.
 */
async function forgetUploads() {
  await world.db('spectra').where({ project_id: world.projectId }).delete();
  await world.db('uploads').where({ project_id: world.projectId }).delete();
}

describe(`upload fuzz (${RUNS} cases)`, () => {
  it('never answers 5xx, never imports part of a file, never takes more than a few seconds, and lets go of the files', async () => {
    const heapAtStart = heapAfterCollection();
    let n = 0;
    const outcomes: Record<string, number> = {};
    await fc.assert(
      fc.asyncProperty(fc.oneof({ arbitrary: measurementFile, weight: 4 }, { arbitrary: spectrumFile, weight: 1 }), async (file) => {
        n++;
        if (n % 1000 === 0) console.log(`upload fuzz: ${n} cases, slowest preview ${slowest.preview.ms.toFixed(0)} ms, commit ${slowest.commit.ms.toFixed(0)} ms`);
        await forgetUploads();
        const before = await counts();
        const post = request(world.app).post(`/api/projects/${world.projectId}/uploads`).set('Authorization', auth).field('kind', file.kind);
        if (file.kind === 'spectrum') post.field('targetId', String(world.targetId));
        const described = `${file.kind === 'spectrum' ? `a spectrum of ${file.points} points` : 'a measurement file'} (${(file.bytes.length / 1e6).toFixed(2)} MB)`;
        const preview = await timed('preview', described, async () => post.attach('file', file.bytes, `fuzz-${n}.csv`));
        expect(preview.status, JSON.stringify(preview.body).slice(0, 300)).toBeLessThan(500);
        expect(await counts()).toEqual(before);
        if (preview.status !== 201) return;

        const upload = preview.body.upload as { id: number; errorCount: number };
        const commit = await timed('commit', described, async () =>
          request(world.app).post(`/api/projects/${world.projectId}/uploads/${upload.id}/commit`).set('Authorization', auth).send({ confirmDuplicate: true }),
        );
        expect(commit.status, JSON.stringify(commit.body).slice(0, 300)).toBeLessThan(500);
        const after = await counts();
        outcomes[`${file.kind} ${commit.status}`] = (outcomes[`${file.kind} ${commit.status}`] ?? 0) + 1;
        if (commit.status === 200 && file.kind === 'measurements') {
          expect(upload.errorCount).toBe(0);
          expect(after.measurements - before.measurements).toBe(commit.body.measurementsAdded);
        } else if (commit.status !== 200) {
          expect(after).toEqual(before);
        }
      }),
      { numRuns: RUNS, endOnFailure: true },
    );
    // What the cases came to (commit answers by kind), so a run that commits nothing shows.
    console.log(`upload fuzz, ${n} cases, commits: ${JSON.stringify(outcomes)}`);
    for (const [what, { ms, file }] of Object.entries(slowest)) console.log(`upload fuzz: slowest ${what} ${ms.toFixed(0)} ms, of ${file} (the limit is ${SLOWEST_MS} ms)`);
    expect(Object.keys(outcomes).some((k) => k.endsWith(' 200'))).toBe(true);
    const growth = heapAfterCollection() - heapAtStart;
    console.log(`upload fuzz: heap ${(heapAtStart / 2 ** 20).toFixed(0)} MB at the start, ${(growth / 2 ** 20).toFixed(1)} MB more after the run`);
    expect(growth).toBeLessThan(HEAP_GROWTH_ALLOWED);
  }, Math.max(120_000, RUNS * 1_000));
});
