import type { Knex } from 'knex';
import { ballesterosTemperatureK } from '../shared/physics/colour-temperature';
import { bolometricCorrectionVMag } from '../shared/physics/bolometric-correction';
import { mainSequenceLogLuminosity } from '../shared/physics/main-sequence';
import { gaussian, mulberry32 } from '../shared/physics/random';
import { CONSTANTS } from '../shared/physics/constants';
import { createUploadsService } from '../server/modules/uploads/uploads.service';
import { systemClock } from '../server/lib/clock';
import { demoTargets } from './01-demo-scenario';

/**
 * A season of invented measurements for the demo targets, sent through the
 * same upload path an observer uses, so every value has its upload, row and
 * observer, and the derived values are proposed as after a real night.
 *
 * Each star gets an invented effective temperature, luminosity and distance;
 * the "observed" numbers are what those would give, plus seeded noise. None
 * of it describes a real star.
 */

interface InventedStar {
  designation: string;
  temperatureK: number;
  logL: number;
  distancePc: number;
  ebv: number;
}

const rand = mulberry32(20261130);
const normal = gaussian(rand);
const between = (lo: number, hi: number) => lo + (hi - lo) * rand();

function inventStar(t: (typeof demoTargets)[number]): InventedStar {
  const tags = new Set(t.tags);
  let temperatureK = between(4600, 6600);
  let offsetDex = normal() * 0.1;
  if (tags.has('hot')) temperatureK = between(9500, 14000);
  if (tags.has('cool')) temperatureK = between(3300, 3900);
  if (tags.has('giant-candidate')) {
    temperatureK = between(4700, 5100);
    offsetDex = between(1.4, 1.9);
  }
  if (tags.has('white-dwarf-candidate')) {
    temperatureK = between(9000, 11000);
    offsetDex = -3.6;
  }
  return {
    designation: t.designation,
    temperatureK,
    logL: mainSequenceLogLuminosity(temperatureK) + offsetDex,
    distancePc: tags.has('giant-candidate') ? between(150, 400) : tags.has('hot') ? between(60, 200) : between(8, 60),
    ebv: Math.max(0, between(-0.01, 0.06)),
  };
}

/** The B−V whose Ballesteros temperature is T (bisection; the relation falls monotonically with B−V). */
function colourFor(temperatureK: number): number {
  let lo = -0.35;
  let hi = 1.95;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (ballesterosTemperatureK(mid) > temperatureK) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

const NIGHTS = ['2026-09-14', '2026-10-03', '2026-10-21', '2026-11-09', '2026-11-27'];
const fmt = (x: number, digits: number) => x.toFixed(digits);

export function seasonCsv(): string {
  const lines = ['target,quantity,value,uncertainty,unit,band,rest_wavelength,observed_at,instrument,note'];
  for (const t of demoTargets) {
    const s = inventStar(t);
    const mBol = 4.74 - 2.5 * s.logL + 5 * Math.log10(s.distancePc / 10);
    const av = 3.1 * s.ebv;
    const v = mBol - bolometricCorrectionVMag(s.temperatureK) + av;
    const bv = colourFor(s.temperatureK) + s.ebv;
    const parallaxMas = 1000 / s.distancePc;
    const peakNm = (CONSTANTS.b.value / s.temperatureK) * 1e9;
    lines.push(`${s.designation},parallax,${fmt(parallaxMas + normal() * 0.05, 3)},0.05,mas,,,,,catalogue parallax`);
    lines.push(`${s.designation},extinction,${fmt(s.ebv, 3)},0.01,mag,,,,,from the programme's reddening map`);
    const nights = NIGHTS.filter(() => rand() < 0.7).slice(0, 3);
    for (const night of nights.length ? nights : [NIGHTS[2]]) {
      const at = `${night}T${String(17 + Math.floor(rand() * 7)).padStart(2, '0')}:${String(Math.floor(rand() * 60)).padStart(2, '0')}:00Z`;
      lines.push(`${s.designation},magnitude,${fmt(v + normal() * 0.015, 3)},0.015,mag,V,,${at},CCD-A,`);
      lines.push(`${s.designation},colour_index,${fmt(bv + normal() * 0.02, 3)},0.02,mag,B-V,,${at},CCD-A,`);
      // The apparent peak of a real spectrum wanders; 4 % scatter is invented for the demo.
      lines.push(`${s.designation},peak_wavelength,${fmt(peakNm * (1 + normal() * 0.04), 1)},${fmt(peakNm * 0.04, 1)},nm,,,${at},spectrograph,`);
    }
    const rv = between(-40, 40) * 1000;
    const observed = 656.279 * (1 + rv / CONSTANTS.c.value);
    lines.push(`${s.designation},line_wavelength,${fmt(observed + normal() * 0.002, 4)},0.002,nm,,656.279,${NIGHTS[3]}T23:10:00Z,echelle,H-alpha`);
  }
  return lines.join('\n') + '\n';
}

/** Commits the season as the demo observer in the demo project. */
export async function seed(knex: Knex): Promise<void> {
  const project = await knex('projects').where({ code: 'GLASSWING' }).first('id');
  const observer = await knex('users').where({ email: 'observer@demo.invalid' }).first('id');
  if (!project || !observer) return;
  const uploads = createUploadsService(knex, systemClock);
  const upload = await uploads.preview(project.id, observer.id, { originalname: 'glasswing-season-2026.csv', buffer: Buffer.from(seasonCsv()) }, { kind: 'measurements' });
  if (upload.errorCount > 0) throw new Error(`demo season has errors: ${JSON.stringify(upload.errors.slice(0, 3))}`);
  await uploads.commit(project.id, upload.id, observer.id, false);
}
