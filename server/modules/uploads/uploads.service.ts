import { createHash } from 'node:crypto';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { AppError, conflict, notFound, validationFailed } from '../../lib/errors';
import { sunCaution } from '../../../shared/sun-proximity';
import { designationKey } from '../../../shared/coordinates';
import { readMeasurementRecords, suggestMapping, type ColumnMapping, type NormalisedRow, type RowError } from '../../../shared/schemas/measurement-file';
import type { Caution, CreateUploadFields, Upload, UploadRowsPage } from '../../../shared/schemas/uploads';
import { appendTrail, appendTrailMany } from '../trail/trail.repository';
import { insertMeasurements, type NewMeasurement } from '../measurements/measurements.repository';
import { rederiveTargets } from '../derived-values/derived-values.service';
import { findTarget } from '../targets/targets.repository';
import { decodeText, parseCsv, type CsvTable } from './csv';
import { readSpectrum } from './spectrum';
import { bulkInsert } from '../../db/bulk-insert';
import {
  earlierUploadWithHash,
  findUpload,
  insertUpload,
  listUploads,
  loadContent,
  loadPreviewState,
  rememberMapping,
  rememberedMapping,
  savePreview,
  setUploadStatus,
  type PreviewState,
} from './uploads.repository';

export interface IncomingFile {
  originalname: string;
  buffer: Buffer;
}

const headerSignature = (headers: string[]) =>
  createHash('sha256').update(JSON.stringify(headers.map((h) => h.trim().toLowerCase()))).digest('hex');

interface KnownTarget {
  id: number;
  designation: string;
  raDeg: number;
  decDeg: number;
}

async function projectTargets(db: Db, projectId: number): Promise<Map<string, KnownTarget>> {
  const rows = await db('targets').where({ project_id: projectId }).select('id', 'designation', 'designation_key', 'ra_deg', 'dec_deg');
  return new Map(rows.map((r) => [r.designation_key, { id: r.id, designation: r.designation, raDeg: r.ra_deg, decDeg: r.dec_deg }]));
}

/**
 * The designation each record of the file gives as sent ('' for none), or
 * null when the mapping names no target column and no record can be placed.
 */
function recordTargets(headers: string[], records: string[][], mapping: ColumnMapping): { column: string; texts: string[] } | null {
  const column = Object.entries(mapping.columns).find(([, r]) => r.role === 'field' && r.field === 'target')?.[0];
  const index = column === undefined ? -1 : headers.indexOf(column);
  if (column === undefined || index < 0) return null;
  return { column, texts: records.map((record) => (record[index] ?? '').trim()) };
}

interface TargetSummary {
  newTargets: string[];
  newTargetErrorRows: number;
  everyRowKnownTarget: boolean;
  cautions: Caution[];
}

/**
 * Matches rows to the project's targets, adds the errors and cautions that
 * need the project's data, and sums up the targets from the same per-row
 * errors the row table shows: a target is named as one the commit creates
 * only when at least one of its rows is free of errors, and rows for new
 * targets that have errors are counted apart.
 */
function matchTargets(
  rows: NormalisedRow[],
  known: Map<string, KnownTarget>,
  errors: RowError[],
  targets: { column: string; texts: string[] } | null,
): TargetSummary {
  const fresh = new Map<string, { designation: string; rows: Set<number>; raDeg: number | null; decDeg: number | null }>();
  for (const r of rows) {
    if (known.has(r.targetKey)) continue;
    const entry = fresh.get(r.targetKey) ?? { designation: r.target, rows: new Set<number>(), raDeg: null, decDeg: null };
    entry.rows.add(r.row);
    if (entry.raDeg === null && r.raDeg !== null) {
      entry.raDeg = r.raDeg;
      entry.decDeg = r.decDeg;
    }
    fresh.set(r.targetKey, entry);
  }
  // Without a position the target cannot be created, so none of its rows can be imported; each says why.
  for (const f of fresh.values()) {
    if (f.raDeg !== null) continue;
    for (const row of f.rows) {
      errors.push({ row, column: 'ra', message: `"${f.designation}" is not a target of this project yet; give its ra and dec on one of its rows to create it.` });
    }
  }
  const cautions: Caution[] = [];
  const seen = new Set<string>();
  for (const r of rows) {
    const k = known.get(r.targetKey);
    const f = fresh.get(r.targetKey);
    const position = k ?? (f && f.raDeg !== null ? { raDeg: f.raDeg, decDeg: f.decDeg! } : undefined);
    const date = r.observedAt ? new Date(r.observedAt) : null;
    const key = `${r.targetKey}:${r.observedAt?.slice(0, 10) ?? ''}`;
    if (seen.has(key)) continue;
    seen.add(key);
    const caution = sunCaution({ designation: r.target, raDeg: position?.raDeg, decDeg: position?.decDeg }, date);
    if (caution) cautions.push({ row: r.row, target: r.target, message: caution.message });
  }
  errors.sort((a, b) => a.row - b.row);

  const rowsWithErrors = new Set(errors.map((e) => e.row));
  const created = new Set<string>();
  let newTargetErrorRows = 0;
  let everyRowKnownTarget = targets !== null && !rowsWithErrors.has(1);
  targets?.texts.forEach((text, i) => {
    const row = i + 2;
    const unreadable = text === '' || errors.some((e) => e.row === row && e.column === targets.column);
    if (unreadable) {
      everyRowKnownTarget = false;
      return;
    }
    const key = designationKey(text);
    if (known.has(key)) return;
    everyRowKnownTarget = false;
    if (rowsWithErrors.has(row)) newTargetErrorRows += 1;
    else created.add(key);
  });
  const newTargets = [...fresh.entries()].filter(([key, f]) => f.raDeg !== null && created.has(key)).map(([, f]) => f.designation);
  return { newTargets, newTargetErrorRows, everyRowKnownTarget, cautions };
}

export function createUploadsService(db: Db, clock: Clock) {
  async function get(projectId: number, uploadId: number): Promise<Upload> {
    const upload = await findUpload(db, projectId, uploadId);
    if (!upload) throw notFound('No such upload in this project.');
    return upload;
  }

  async function spectrumTarget(projectId: number, targetId: number | null | undefined) {
    if (!targetId) throw validationFailed([{ path: 'targetId', message: 'Choose the target this spectrum belongs to.' }]);
    const target = await findTarget(db, projectId, targetId);
    if (!target) throw validationFailed([{ path: 'targetId', message: `This project has no target with id ${targetId}; choose the target this spectrum belongs to.` }]);
    return target;
  }

  async function analyse(
    projectId: number,
    uploadId: number,
    kind: Upload['kind'],
    table: CsvTable,
    options: { mapping?: ColumnMapping; targetId?: number | null; wavelengthUnit?: CreateUploadFields['wavelengthUnit']; sha256: string },
  ): Promise<void> {
    const duplicateOf = await earlierUploadWithHash(db, projectId, options.sha256, uploadId);
    if (kind === 'spectrum') {
      const target = await spectrumTarget(projectId, options.targetId);
      const { spectrum, errors, rowCount } = readSpectrum(table, target.id, options.wavelengthUnit);
      const caution = sunCaution(target, null);
      await savePreview(db, uploadId, {
        rowCount,
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
          duplicateOf,
          spectrum,
        },
      });
      return;
    }
    const mapping =
      options.mapping ?? (await rememberedMapping(db, projectId, headerSignature(table.headers))) ?? suggestMapping(table.headers);
    const { rows, errors } = readMeasurementRecords(table.headers, table.records, mapping);
    const targets = matchTargets(rows, await projectTargets(db, projectId), errors, recordTargets(table.headers, table.records, mapping));
    await savePreview(db, uploadId, {
      rowCount: table.records.length,
      errors,
      mapping,
      preview: { headers: table.headers, rows, measurementCount: rows.length, ...targets, duplicateOf, spectrum: null },
    });
  }

  async function tableOf(projectId: number, uploadId: number): Promise<{ table: CsvTable; sha256: string }> {
    const stored = await loadContent(db, projectId, uploadId);
    if (!stored) throw notFound('No such upload in this project.');
    return { table: parseCsv(decodeText(stored.content)), sha256: stored.sha256 };
  }

  async function commitMeasurements(trx: Db, projectId: number, uploadId: number, state: PreviewState, actorUserId: number, now: Date) {
    const known = await projectTargets(trx, projectId);
    const created: string[] = [];
    const firstWithCoords = new Map<string, NormalisedRow>();
    for (const r of state.rows) {
      if (!known.has(r.targetKey) && r.raDeg !== null && !firstWithCoords.has(r.targetKey)) firstWithCoords.set(r.targetKey, r);
    }
    const toCreate = [...firstWithCoords.values()];
    await bulkInsert(
      trx,
      'targets',
      toCreate.map((r) => ({
        project_id: projectId,
        designation: r.target,
        designation_key: r.targetKey,
        ra_deg: r.raDeg,
        dec_deg: r.decDeg,
        notes: '',
        tags: '[]',
        created_at: now.toISOString(),
        updated_at: now.toISOString(),
      })),
    );
    created.push(...toCreate.map((r) => r.target));
    const ids = toCreate.length ? await projectTargets(trx, projectId) : known;
    // Each target the file creates gets its own trail entry, as one made by hand would.
    await appendTrailMany(
      trx,
      toCreate.map((r) => {
        const targetId = ids.get(r.targetKey)!.id;
        return {
          projectId,
          actorUserId,
          action: 'target.created',
          entityType: 'target',
          entityId: targetId,
          targetId,
          after: { designation: r.target, ra: r.raDeg, dec: r.decDeg, uploadId, row: r.row },
        };
      }),
      now,
    );
    const measurements: NewMeasurement[] = state.rows.map((r) => {
      const target = ids.get(r.targetKey);
      if (!target) throw new AppError(409, 'conflict', `Target "${r.target}" (row ${r.row}) has no coordinates; preview the file again.`);
      return {
        projectId,
        targetId: target.id,
        uploadId,
        rowNumber: r.row,
        kind: r.kind,
        valueSi: r.valueSi,
        uncertaintySi: r.uncertaintySi,
        unitSi: r.unitSi,
        valueAsSent: r.value,
        uncertaintyAsSent: r.uncertainty,
        unitAsSent: r.unit,
        band: r.band,
        restWavelengthSi: r.restWavelengthSi,
        landeG: r.landeG,
        observedAt: r.observedAt,
        instrument: r.instrument,
        note: r.note,
        extra: r.extra,
        observerUserId: actorUserId,
      };
    });
    await insertMeasurements(trx, measurements, now);
    return { targetIds: [...new Set(measurements.map((m) => m.targetId))], createdTargets: created, measurementsAdded: measurements.length };
  }

  async function commitSpectrum(trx: Db, projectId: number, uploadId: number, state: PreviewState, actorUserId: number, now: Date) {
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
    return { targetIds: [spectrum.targetId], createdTargets: [] as string[], measurementsAdded: 1 + peak.length };
  }

  return {
    get,
    list: (projectId: number) => listUploads(db, projectId),

    /** Keeps the file byte for byte, reads it and saves the preview; nothing is imported yet. */
    async preview(projectId: number, actorUserId: number, file: IncomingFile | undefined, fields: CreateUploadFields): Promise<Upload> {
      if (!file) throw validationFailed([{ path: 'file', message: 'Choose a file to upload (form field "file").' }]);
      // Checked before anything is stored: the upload row refers to the target.
      if (fields.kind === 'spectrum') await spectrumTarget(projectId, fields.targetId);
      const text = decodeText(file.buffer);
      const table = parseCsv(text);
      const sha256 = createHash('sha256').update(file.buffer).digest('hex');
      const uploadId = await db.transaction(async (trx) => {
        const id = await insertUpload(
          trx,
          { projectId, userId: actorUserId, kind: fields.kind, filename: file.originalname.slice(0, 255), content: file.buffer, sha256, targetId: fields.targetId ?? null },
          clock.now(),
        );
        await appendTrail(trx, { projectId, actorUserId, action: 'upload.received', entityType: 'upload', entityId: id, after: { filename: file.originalname, sha256, kind: fields.kind } }, clock.now());
        return id;
      });
      try {
        await analyse(projectId, uploadId, fields.kind, table, { mapping: fields.mapping, targetId: fields.targetId, wavelengthUnit: fields.wavelengthUnit, sha256 });
      } catch (e) {
        // A file that cannot be read is discarded at once; the trail says so beside its receipt.
        await db.transaction(async (trx) => {
          await setUploadStatus(trx, uploadId, 'discarded', null);
          await appendTrail(
            trx,
            { projectId, actorUserId, action: 'upload.discarded', entityType: 'upload', entityId: uploadId, note: e instanceof AppError ? e.message.slice(0, 500) : '' },
            clock.now(),
          );
        });
        throw e;
      }
      return get(projectId, uploadId);
    },

    /** Reads the kept file again under a new column mapping. */
    async remap(projectId: number, uploadId: number, mapping: ColumnMapping): Promise<Upload> {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is ${upload.status}; upload the file again to change its mapping.`);
      if (upload.kind !== 'measurements') throw conflict('A spectrum has no column mapping.');
      const { table, sha256 } = await tableOf(projectId, uploadId);
      await analyse(projectId, uploadId, 'measurements', table, { mapping, sha256 });
      return get(projectId, uploadId);
    },

    /** One page of the file as sent, each row with its errors, for the preview table. */
    async rows(projectId: number, uploadId: number, query: { page: number; pageSize: number; onlyErrors: boolean }): Promise<UploadRowsPage> {
      const upload = await get(projectId, uploadId);
      const { table } = await tableOf(projectId, uploadId);
      const errorsByRow = new Map<number, RowError[]>();
      for (const e of upload.errors) errorsByRow.set(e.row, [...(errorsByRow.get(e.row) ?? []), e]);
      let all = table.records.map((cells, i) => ({ row: i + 2, cells }));
      if (query.onlyErrors) all = all.filter((r) => errorsByRow.has(r.row));
      const start = (query.page - 1) * query.pageSize;
      return {
        headers: table.headers,
        rows: all.slice(start, start + query.pageSize).map((r) => ({ ...r, errors: errorsByRow.get(r.row) ?? [] })),
        total: all.length,
        page: query.page,
        pageSize: query.pageSize,
      };
    },

    /**
     * Imports the whole preview in one transaction — targets, measurements,
     * the upload's status, the trail, the remembered mapping and the new
     * proposed derived values — or nothing.
     */
    async commit(projectId: number, uploadId: number, actorUserId: number, confirmDuplicate: boolean) {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is already ${upload.status}.`);
      if (upload.errorCount > 0) {
        throw new AppError(422, 'validation_failed', `The file has ${upload.errorCount} error(s); fix them and upload it again. Nothing was imported.`, upload.errors.slice(0, 50));
      }
      if (upload.duplicateOf && !confirmDuplicate) {
        throw conflict(`The same file was uploaded before (upload ${upload.duplicateOf}). Commit again with confirmDuplicate to import it a second time.`, [
          { path: 'confirmDuplicate', message: `Same bytes as upload ${upload.duplicateOf}.` },
        ]);
      }
      const state = await loadPreviewState(db, uploadId);
      if (!state) throw conflict('This upload has no preview; upload the file again.');
      const result = await db.transaction(async (trx) => {
        const now = clock.now();
        if ((await setUploadStatus(trx, uploadId, 'committed', now)) === 0) throw conflict('This upload was committed or discarded meanwhile.');
        const imported =
          upload.kind === 'spectrum'
            ? await commitSpectrum(trx, projectId, uploadId, state, actorUserId, now)
            : await commitMeasurements(trx, projectId, uploadId, state, actorUserId, now);
        if (upload.mapping) await rememberMapping(trx, projectId, headerSignature(state.headers), upload.mapping, now);
        const { proposed } = await rederiveTargets(trx, projectId, imported.targetIds, actorUserId, now);
        await appendTrail(
          trx,
          {
            projectId,
            actorUserId,
            action: 'upload.committed',
            entityType: 'upload',
            entityId: uploadId,
            // A spectrum belongs to one target; a measurement file may touch many, each with its own entries.
            targetId: upload.kind === 'spectrum' ? imported.targetIds[0] : null,
            after: { filename: upload.filename, measurementsAdded: imported.measurementsAdded, targetsCreated: imported.createdTargets.length, derivedProposed: proposed },
          },
          now,
        );
        return { measurementsAdded: imported.measurementsAdded, targetsCreated: imported.createdTargets, derivedProposed: proposed };
      });
      const committed = await get(projectId, uploadId);
      return { upload: committed, ...result, targets: committed.targets };
    },

    async discard(projectId: number, uploadId: number, actorUserId: number): Promise<Upload> {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is already ${upload.status}.`);
      await db.transaction(async (trx) => {
        await setUploadStatus(trx, uploadId, 'discarded', null);
        await appendTrail(
          trx,
          {
            projectId,
            actorUserId,
            action: 'upload.discarded',
            entityType: 'upload',
            entityId: uploadId,
            targetId: upload.spectrum?.targetId ?? null,
            before: { filename: upload.filename, status: upload.status },
          },
          clock.now(),
        );
      });
      return get(projectId, uploadId);
    },

    async raw(projectId: number, uploadId: number) {
      const stored = await loadContent(db, projectId, uploadId);
      if (!stored) throw notFound('No such upload in this project.');
      return stored;
    },
  };
}

export type UploadsService = ReturnType<typeof createUploadsService>;
