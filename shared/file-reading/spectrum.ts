import { findContinuumPeak, fitPlanck } from '../physics/planck';
import { PhysicsError } from '../physics/errors';
import type { Measured } from '../physics/measured';
import { toSi, WAVELENGTH_UNITS, type UnitName } from '../physics/units';
import { normaliseHeader, readNumber, type RowError } from './measurement-file';
import type { SpectrumPreview } from '../schemas/uploads';
import type { CsvTable } from './text';

const UNIT_IN_HEADER: [RegExp, UnitName][] = [
  [/(?:^|[_(\s])(nm|nanomet(?:er|re)s?)\)?$/, 'nm'],
  [/(?:^|[_(\s])(å|angstroms?|aa|a)\)?$/i, 'angstrom'],
  [/(?:^|[_(\s])(um|µm|μm|microns?)\)?$/, 'um'],
  [/(?:^|[_(\s])(m)\)?$/, 'm'],
];

const WAVELENGTH_WORDS = `${WAVELENGTH_UNITS.slice(0, -1).join(', ')} or ${WAVELENGTH_UNITS.at(-1)}`;

function unitFromHeader(header: string): UnitName | null {
  const h = normaliseHeader(header);
  for (const [re, unit] of UNIT_IN_HEADER) if (re.test(h)) return unit;
  return null;
}

/**
 * Reads a two- or three-column spectrum (wavelength, flux, optional flux
 * uncertainty), fits a Planck curve and, independently, finds the continuum
 * peak. Row errors name row and column; a Planck fit that cannot be made is an
 * error on the flux column, not a crash; a peak that cannot be found is not an
 * error (the fit still stands) but is said in words beside the fit.
 */
export function readSpectrum(
  table: CsvTable,
  targetId: number,
  givenUnit: UnitName | undefined,
): { spectrum: SpectrumPreview; errors: RowError[]; rowCount: number } {
  const errors: RowError[] = [];
  const [wHeader, fHeader, sHeader] = table.headers;
  if (!fHeader) errors.push({ row: 1, column: wHeader ?? '', message: 'A spectrum needs two columns: wavelength and flux.' });
  const unit = givenUnit ?? unitFromHeader(wHeader ?? '');
  if (!unit) errors.push({ row: 1, column: wHeader ?? '', message: `Say the wavelength unit (${WAVELENGTH_WORDS}), in the form or in the header, e.g. "wavelength_nm".` });
  const points: [number, number][] = [];
  const sigma: number[] = [];
  table.records.forEach((record, i) => {
    const row = i + 2;
    const w = readNumber(record[0] ?? '', 'the wavelength');
    const f = readNumber(record[1] ?? '', 'the flux');
    const s = sHeader ? readNumber(record[2] ?? '', 'the flux uncertainty') : null;
    if (!w.ok) errors.push({ row, column: wHeader, message: w.message });
    else if (w.value <= 0) errors.push({ row, column: wHeader, message: `The wavelength must be positive (got ${w.value}).` });
    if (!f.ok) errors.push({ row, column: fHeader, message: f.message });
    if (s && !s.ok) errors.push({ row, column: sHeader, message: s.message });
    else if (s?.ok && s.value <= 0) errors.push({ row, column: sHeader, message: `The flux uncertainty must be positive (got ${s.value}).` });
    if (w.ok && f.ok && unit && w.value > 0) {
      points.push([toSi(w.value, unit), f.value]);
      if (s?.ok) sigma.push(s.value);
    }
  });
  const spectrum: SpectrumPreview = { targetId, wavelengthUnit: unit ?? '', points, fit: null };
  if (errors.length === 0) {
    const order = points.map((_, i) => i).sort((a, b) => points[a][0] - points[b][0]);
    const sorted = { wavelengthM: order.map((i) => points[i][0]), flux: order.map((i) => points[i][1]), fluxSigma: sHeader ? order.map((i) => sigma[i]) : undefined };
    spectrum.points = order.map((i) => points[i]);
    // The fit and the peak are separate results: a hot star's peak lies blueward of the optical, yet its Planck fit stands.
    let fit: ReturnType<typeof fitPlanck> | null = null;
    try {
      fit = fitPlanck(sorted);
    } catch (e) {
      if (!(e instanceof PhysicsError)) throw e;
      errors.push({ row: 1, column: fHeader, message: `No Planck fit: ${e.message}.` });
    }
    if (fit) {
      let peak: Measured | null = null;
      let noPeakReason: string | null = null;
      try {
        peak = findContinuumPeak(sorted);
      } catch (e) {
        if (!(e instanceof PhysicsError)) throw e;
        noPeakReason = `${e.message.charAt(0).toUpperCase()}${e.message.slice(1)}.`;
      }
      spectrum.fit = {
        temperatureK: fit.temperatureK.value,
        temperatureSigmaK: fit.temperatureK.sigma,
        logScale: fit.logScale.value,
        reducedChiSquare: fit.reducedChiSquare,
        weighted: sorted.fluxSigma !== undefined,
        noiseWords: fit.noise.words,
        peakWavelengthM: peak?.value ?? null,
        peakWavelengthSigmaM: peak?.sigma ?? null,
        noPeakReason,
        warnings: fit.warnings.map((w) => ({ code: w.code, message: w.message })),
      };
    }
  }
  return { spectrum, errors, rowCount: table.records.length };
}
