/**
 * `npm run bench:spectrum`: times each step of the spectrum route (CSV
 * parsing, the Planck fit, the continuum-peak search, and readSpectrum, which
 * does all of it as an upload's preview does) on synthetic 5800 K spectra of
 * 2 000, 20 000 and 200 000 points over 350–1000 nm with 1 % noise. Prints the
 * median of several runs per size and the time per n log₂ n, which stays
 * roughly flat when a step costs at most n log n.
 */
import { gaussian, mulberry32 } from '../shared/physics/random';
import { findContinuumPeak, fitPlanck, planckSpectralRadiance } from '../shared/physics/planck';
import { decodeText, parseCsv } from '../shared/file-reading/text';
import { readSpectrum } from '../shared/file-reading/spectrum';

const SIZES = (process.env.BENCH_SIZES ?? '2000,20000,200000').split(',').map(Number);
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const TEMPERATURE_K = 5800;

function makeCsv(points: number): Buffer {
  const normal = gaussian(mulberry32(points));
  const scale = 1e-20;
  const top = scale * planckSpectralRadiance(2.897771955e-3 / TEMPERATURE_K, TEMPERATURE_K);
  const lines = ['wavelength_nm,flux'];
  for (let i = 0; i < points; i++) {
    const nm = 350 + (650 * i) / (points - 1);
    lines.push(`${nm.toFixed(5)},${(scale * planckSpectralRadiance(nm * 1e-9, TEMPERATURE_K) + 0.01 * top * normal()).toPrecision(7)}`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}

function medianMs(run: () => unknown): number {
  const times: number[] = [];
  // One run first, untimed, so the compiler has warmed up before the clock starts.
  run();
  for (let r = 0; r < RUNS; r++) {
    const t0 = performance.now();
    run();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[times.length >> 1];
}

const rows: Record<string, string>[] = [];
for (const n of SIZES) {
  const bytes = makeCsv(n);
  const table = parseCsv(decodeText(bytes));
  const spectrum = {
    wavelengthM: table.records.map((r) => Number(r[0]) * 1e-9),
    flux: table.records.map((r) => Number(r[1])),
  };
  const parse = medianMs(() => parseCsv(decodeText(bytes)));
  const fit = medianMs(() => fitPlanck(spectrum));
  const peak = medianMs(() => findContinuumPeak(spectrum));
  const route = medianMs(() => readSpectrum(table, 1, undefined));
  const { spectrum: preview, errors } = readSpectrum(table, 1, undefined);
  if (errors.length > 0 || !preview.fit) throw new Error(`the spectrum of ${n} points did not fit: ${errors.map((e) => e.message).join('; ')}`);
  const nLogN = n * Math.log2(n);
  rows.push({
    points: n.toLocaleString('en-GB'),
    'file MB': (bytes.length / 1e6).toFixed(2),
    'parse ms': parse.toFixed(1),
    'Planck fit ms': fit.toFixed(1),
    'peak ms': peak.toFixed(1),
    'readSpectrum ms': route.toFixed(1),
    'readSpectrum ns per n log₂ n': ((route * 1e6) / nLogN).toFixed(1),
    'T (K)': `${preview.fit.temperatureK.toFixed(1)} ± ${preview.fit.temperatureSigmaK.toPrecision(2)}`,
    'peak (nm)': preview.fit.peakWavelengthM === null ? 'none' : (preview.fit.peakWavelengthM * 1e9).toFixed(2),
  });
}
console.log(`Spectrum route, median of ${RUNS} runs, ${TEMPERATURE_K} K blackbody (Wien peak ${((2.897771955e-3 / TEMPERATURE_K) * 1e9).toFixed(2)} nm, CODATA 2018 b)`);
console.table(rows);
console.log(`Peak resident memory: ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
