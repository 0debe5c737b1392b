/**
 * Throughput of the derivation engine: 100 000 invented stars, each with a
 * full set of measurements, through deriveAll. Prints stars per second and
 * peak memory. Half the stars carry a measured bolometric flux; the other
 * half derive it from V and the bolometric correction, so that every Monte
 * Carlo route is exercised.
 *
 * Each star draws from a base seed of its own unless --seed gives one for
 * all, as the server derives (it leaves the default, 1): the engine keeps
 * the Monte Carlo deviates of a seed, so the two measure its two regimes.
 *
 *   npm run bench:derive [-- --stars 20000 --samples 1000 --seed 1]
 */
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

const STARS = argument('stars', 100_000);
const SAMPLES = argument('samples', 1000);
const SHARED_SEED = process.argv.includes('--seed') ? argument('seed', 1) : undefined;
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

// The invented measurements are held in memory before timing starts; this
// baseline separates their share of the RSS from the engine's.
const baselineRss = process.memoryUsage().rss;
let peakRss = baselineRss;
let derived = 0;
let issues = 0;
const started = performance.now();
for (let n = 0; n < stars.length; n++) {
  const graph = deriveAll(stars[n], { monteCarloSamples: SAMPLES, seed: SHARED_SEED ?? n });
  for (const key in graph.results) if (Object.prototype.hasOwnProperty.call(graph.results, key)) derived += 1;
  issues += graph.issues.length;
  if (n % 1000 === 0) peakRss = Math.max(peakRss, process.memoryUsage().rss);
}
const seconds = (performance.now() - started) / 1000;
peakRss = Math.max(peakRss, process.memoryUsage().rss);
const maxRssKiB = resourceUsage().maxRSS;

console.log(`stars: ${STARS}, Monte Carlo draws per non-linear quantity: ${SAMPLES}, base seed: ${SHARED_SEED ?? 'one per star'}`);
console.log(`derived values: ${derived} (${(derived / STARS).toFixed(1)} per star), issues: ${issues}`);
console.log(`time: ${seconds.toFixed(2)} s, throughput: ${Math.round(STARS / seconds)} stars/s`);
console.log(
  `RSS with the measurements loaded: ${(baselineRss / 2 ** 20).toFixed(0)} MiB; peak RSS sampled while deriving: ${(peakRss / 2 ** 20).toFixed(0)} MiB; process maxRSS: ${(maxRssKiB / 1024).toFixed(0)} MiB`,
);
