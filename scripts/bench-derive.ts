/**
 * Throughput of the derivation engine beside what a practitioner would
 * write instead (../shared/bench/numpy_mc_derive.py: numpy, the same
 * correlated chain, vectorised), run in turns in one process tree: a round
 * of the engine over invented stars, then the numpy script over as many,
 * `--rounds` times; medians of stars per second and the ratio, with each
 * side's peak memory. Half the stars carry a measured bolometric flux; the
 * other half derive it from V and the bolometric correction, so that every
 * route is exercised. Each star draws from a seed of its own, as the server
 * gives each target its own.
 *
 *   npm run bench:derive [-- --stars 5000 --samples 1000 --rounds 5]
 */
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { resourceUsage } from 'node:process';
import { performance } from 'node:perf_hooks';
import { CONSTANTS } from '../shared/physics/constants';
import { deriveAll, type MeasurementInput } from '../shared/physics/derive';
import { gaussian, mulberry32 } from '../shared/physics/random';
import { DWARF_SEQUENCE } from '../shared/physics/tables/dwarf-sequence';
import { UNITS } from '../shared/physics/units';

function argument(name: string, fallback: number): number {
  const at = process.argv.indexOf(`--${name}`);
  const value = at >= 0 ? Number(process.argv[at + 1]) : fallback;
  return Number.isFinite(value) && value > 0 ? value : fallback;
}

const STARS = argument('stars', 5000);
const SAMPLES = argument('samples', 1000);
const ROUNDS = argument('rounds', 5);
const NUMPY_SCRIPT = resolve(process.cwd(), '../shared/bench/numpy_mc_derive.py');
const NM = UNITS.nm.toSi;
const MAS = UNITS.mas.toSi;

const uniform = mulberry32(2024);
const normal = gaussian(uniform);

/** One invented star's measurements, loosely consistent with a dwarf of the table. */
function inventStar(n: number): MeasurementInput[] {
  const rows = DWARF_SEQUENCE.filter((row) => row.bMinusVMag !== null && row.teffK > 3000 && row.teffK < 30000);
  const row = rows[Math.floor(uniform() * rows.length)];
  const t = row.teffK * (1 + 0.02 * normal());
  const distancePc = 10 + 490 * uniform();
  const luminosityW = CONSTANTS.L_sun.value * 10 ** row.logLLsun;
  const fluxWm2 = luminosityW / (4 * Math.PI * (distancePc * CONSTANTS.pc.value) ** 2);
  const vMag = -2.5 * Math.log10(fluxWm2 / CONSTANTS.f_0.value) - row.bcVMag;
  const id = n * 16;
  const list: MeasurementInput[] = [
    { id: id + 1, kind: 'peak_wavelength', valueSi: CONSTANTS.b.value / t, uncertaintySi: 15 * NM },
    { id: id + 2, kind: 'colour_index', band: 'B-V', valueSi: (row.bMinusVMag as number) + 0.05, uncertaintySi: 0.02 },
    { id: id + 3, kind: 'extinction', valueSi: 0.05, uncertaintySi: 0.01 },
    { id: id + 4, kind: 'magnitude', band: 'V', valueSi: vMag + 0.155, uncertaintySi: 0.02 },
    { id: id + 5, kind: 'parallax', valueSi: (1000 / distancePc) * MAS, uncertaintySi: 0.05 * MAS },
    { id: id + 6, kind: 'planck_temperature', valueSi: t, uncertaintySi: 80 },
    { id: id + 7, kind: 'line_wavelength', valueSi: 656.279 * NM * (1 + 2e-5 * normal()), uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
    { id: id + 8, kind: 'line_wavelength', valueSi: 486.135 * NM * (1 + 2e-5 * normal()), uncertaintySi: 0.002 * NM, restWavelengthSi: 486.135 * NM },
    { id: id + 9, kind: 'limb_separation', valueSi: 0.02 * NM, uncertaintySi: 0.002 * NM, restWavelengthSi: 656.279 * NM },
    { id: id + 10, kind: 'zeeman_separation', valueSi: 0.004 * NM, uncertaintySi: 0.001 * NM, restWavelengthSi: 525.0212 * NM, landeG: 3 },
  ];
  if (n % 2 === 0) list.push({ id: id + 11, kind: 'bolometric_flux', valueSi: fluxWm2, uncertaintySi: 0.03 * fluxWm2 });
  return list;
}

const stars = Array.from({ length: STARS }, (_, n) => inventStar(n));
const baselineRss = process.memoryUsage().rss;

/** One round of the engine: stars per second, and the values and issues it gave. */
function engineRound(): { rate: number; derived: number; issues: number } {
  let derived = 0;
  let issues = 0;
  const started = performance.now();
  for (let n = 0; n < stars.length; n++) {
    const graph = deriveAll(stars[n], { monteCarloSamples: SAMPLES, seed: n });
    for (const key in graph.results) if (Object.prototype.hasOwnProperty.call(graph.results, key)) derived += 1;
    issues += graph.issues.length;
  }
  return { rate: STARS / ((performance.now() - started) / 1000), derived, issues };
}

/** One run of the numpy script over as many stars; its own stars per second and its peak RSS (ru_maxrss, KiB on Linux). */
function numpyRound(): { rate: number; maxRssKiB: number; line: string } {
  const wrapper = `import resource, runpy, sys\nsys.argv = [sys.argv[1], sys.argv[2], sys.argv[3]]\nrunpy.run_path(sys.argv[0], run_name='__main__')\nprint('maxrss', resource.getrusage(resource.RUSAGE_SELF).ru_maxrss)`;
  const run = spawnSync('python3', ['-c', wrapper, NUMPY_SCRIPT, String(STARS), String(SAMPLES)], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`numpy script failed: ${run.stderr}`);
  const line = run.stdout.split('\n').find((l) => l.startsWith('numpy')) ?? '';
  const rate = Number((/= ([\d,]+) stars\/s/.exec(line)?.[1] ?? 'NaN').replace(/,/g, ''));
  const maxRssKiB = Number(/maxrss (\d+)/.exec(run.stdout)?.[1] ?? 'NaN');
  return { rate, maxRssKiB, line };
}

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

console.log(`stars per round: ${STARS}, Monte Carlo draws per measurement: ${SAMPLES}, each star its own seed; rounds: ${ROUNDS}, engine and numpy in turns`);
const engineRates: number[] = [];
const numpyRates: number[] = [];
let numpyPeakKiB = 0;
let last = { derived: 0, issues: 0 };
for (let round = 0; round < ROUNDS; round++) {
  const e = engineRound();
  engineRates.push(e.rate);
  last = e;
  const p = numpyRound();
  numpyRates.push(p.rate);
  numpyPeakKiB = Math.max(numpyPeakKiB, p.maxRssKiB);
  console.log(`round ${round + 1}: engine ${Math.round(e.rate)} stars/s, numpy ${Math.round(p.rate)} stars/s (${p.line})`);
}
const maxRssKiB = resourceUsage().maxRSS;
console.log(`engine: derived values per star ${(last.derived / STARS).toFixed(1)}, issues ${last.issues}`);
console.log(`median engine ${Math.round(median(engineRates))} stars/s, median numpy ${Math.round(median(numpyRates))} stars/s, ratio ${(median(engineRates) / median(numpyRates)).toFixed(2)}`);
console.log(
  `peak memory: engine process maxRSS ${(maxRssKiB / 1024).toFixed(0)} MiB (${(baselineRss / 2 ** 20).toFixed(0)} MiB with the measurements loaded, before deriving); numpy process maxRSS ${(numpyPeakKiB / 1024).toFixed(0)} MiB`,
);
