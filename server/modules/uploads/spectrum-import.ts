import type { Db } from '../../db/knex';
import { validationFailed } from '../../lib/errors';
import { sunCaution } from '../../../shared/sun-proximity';
import type { CreateUploadFields } from '../../../shared/schemas/uploads';
import { insertMeasurements } from '../measurements/measurements.repository';
import { findTarget } from '../targets/targets.repository';
import type { CsvTable } from '../../../shared/file-reading/text';
import { readSpectrum } from '../../../shared/file-reading/spectrum';
import type { Analysis, CommitContext, Imported } from './upload-pipeline';
import type { PreviewState } from './uploads.repository';

/**
 * Spectra: one target's two- or three-column file, fitted with a Planck curve
 * (the analysis the preview shows); the commit keeps the spectrum and records
 * the fitted temperature and the continuum peak as measurements.
 */

/** The target a spectrum belongs to, which must be one of the project's; checked before anything is stored. */
export async function spectrumTarget(db: Db, projectId: number, targetId: number | null | undefined) {
  if (!targetId) throw validationFailed([{ path: 'targetId', message: 'Choose the target this spectrum belongs to.' }]);
  const target = await findTarget(db, projectId, targetId);
  if (!target) throw validationFailed([{ path: 'targetId', message: `This project has no target with id ${targetId}; choose the target this spectrum belongs to.` }]);
  return target;
}

export async function analyseSpectrum(
  db: Db,
  projectId: number,
  table: CsvTable,
  options: { targetId: number | null | undefined; wavelengthUnit?: CreateUploadFields['wavelengthUnit']; duplicateOf: number | null },
): Promise<Analysis> {
  const target = await spectrumTarget(db, projectId, options.targetId);
  const { spectrum, errors } = readSpectrum(table, target.id, options.wavelengthUnit);
  const caution = sunCaution(target, null);
  return {
    records: table.records,
    errors,
    mapping: null,
    preview: {
      headers: table.headers,
      rows: [],
      newTargets: [],
      newTargetErrorRows: 0,
      everyRowKnownTarget: false,
      cautions: caution ? [{ row: null, target: target.designation, message: caution.message }] : [],
      measurementCount: 0,
      duplicateOf: options.duplicateOf,
      spectrum,
    },
  };
}

export async function commitSpectrum(trx: Db, ctx: CommitContext, state: PreviewState): Promise<Imported> {
const { projectId, uploadId, actorUserId, now } = ctx;
  const spectrum = state.spectrum!;
  const fit = spectrum.fit!;
  await trx('spectra').insert({
    project_id: projectId,
    target_id: spectrum.targetId,
    upload_id: uploadId,
    points_json: JSON.stringify(spectrum.points),
    fit_json: JSON.stringify(fit),
    observed_at: null,
    created_at: now.toISOString(),
  });
  const common = {
    projectId,
    targetId: spectrum.targetId,
    uploadId,
    rowNumber: null,
    band: null,
    restWavelengthSi: null,
    landeG: null,
    observedAt: null,
    instrument: null,
    extra: {},
    observerUserId: actorUserId,
  };
  const planck = {
    ...common,
    kind: 'planck_temperature' as const,
    valueSi: fit.temperatureK,
    uncertaintySi: fit.temperatureSigmaK,
    unitSi: 'K',
    valueAsSent: fit.temperatureK,
    uncertaintyAsSent: fit.temperatureSigmaK,
    unitAsSent: 'K',
    note: fit.weighted
      ? `Planck fit to the spectrum of upload ${uploadId} (reduced χ² ${fit.reducedChiSquare.toPrecision(3)}).`
      : `Planck fit to the spectrum of upload ${uploadId} (${fit.noiseWords ?? 'no flux uncertainties given; σ from the scatter about the fit'}).`,
  };
  // The peak is found apart from the fit; a hot star's lies outside the optical and only the fit is recorded.
  const peak =
    fit.peakWavelengthM === null || fit.peakWavelengthSigmaM === null
      ? []
      : [
          {
            ...common,
            kind: 'peak_wavelength' as const,
            valueSi: fit.peakWavelengthM,
            uncertaintySi: fit.peakWavelengthSigmaM,
            unitSi: 'm',
            valueAsSent: fit.peakWavelengthM,
            uncertaintyAsSent: fit.peakWavelengthSigmaM,
            unitAsSent: 'm',
            note: `Continuum peak of the spectrum of upload ${uploadId}.`,
          },
        ];
  await insertMeasurements(trx, [planck, ...peak], now);
  ctx.report({ rowsWritten: 1 + peak.length });
  return { targetIds: [spectrum.targetId], createdTargets: [], measurementsAdded: 1 + peak.length, targetId: spectrum.targetId };
}
