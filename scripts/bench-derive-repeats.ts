/**
 * `npm run bench:derive-repeats [-- --counts 10,100,1000,2000,5000]`: one
 * target observed over and over, as a monitoring campaign leaves it: N
 * V magnitudes, N parallaxes and N Planck temperatures (each from a
 * spectrum of its own), scattered about their values by several σ so that
 * many pairs disagree. Times deriveAll for each N (median of five runs) and
 * counts the warnings it writes, which must stay bounded: the combination
 * counts every disagreeing pair but names only the most apart
 * (shared/physics/measured.ts, MOST_DISCORDANT_PAIRS).
 */
import { deriveAll, type MeasurementInput } from '../shared/physics/derive';
import { UNITS } from '../shared/physics/units';

const at = process.argv.indexOf('--counts');
const COUNTS = (at >= 0 ? process.argv[at + 1] : '10,100,1000,2000,5000').split(',').map(Number);
const MAS = UNITS.mas.toSi;

function campaign(n: number): MeasurementInput[] {
  const list: MeasurementInput[] = [];
  // A deterministic spread of ±4 σ about each value (Weyl sequence), not random, so every run derives the same.
  const spread = (i: number) => (((i * 0.6180339887) % 1) - 0.5) * 8;
  for (let i = 0; i < n; i++) {
    list.push({ id: 3 * i + 1, kind: 'magnitude', band: 'V', valueSi: 8.2 + 0.02 * spread(i), uncertaintySi: 0.02 });
    list.push({ id: 3 * i + 2, kind: 'parallax', valueSi: (10 + 0.1 * spread(i + 7)) * MAS, uncertaintySi: 0.1 * MAS });
    list.push({ id: 3 * i + 3, kind: 'planck_temperature', valueSi: 5800 + 40 * spread(i + 13), uncertaintySi: 40, spectrumId: 100_000 + i });
  }
  return list;
}

const rows: Record<string, string>[] = [];
for (const n of COUNTS) {
  const inputs = campaign(n);
  const times: number[] = [];
  let warnings = 0;
  for (let run = 0; run < 6; run++) {
    const t0 = performance.now();
    const graph = deriveAll(inputs, { seed: 42 });
    // The first run warms the compiler and is not timed.
    if (run > 0) times.push(performance.now() - t0);
    warnings = Object.values(graph.results).reduce((sum, r) => sum + (r?.warnings.length ?? 0), 0);
  }
  times.sort((a, b) => a - b);
  rows.push({ 'estimates of each': n.toLocaleString('en-GB'), 'measurements': (3 * n).toLocaleString('en-GB'), 'deriveAll ms': times[times.length >> 1].toFixed(1), 'warnings written': String(warnings) });
}
console.log('One target observed N times: V, parallax and Planck temperature each N times (median of 5 runs)');
console.table(rows);
