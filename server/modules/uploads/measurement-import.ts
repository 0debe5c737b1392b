import type { Db } from '../../db/knex';
import { AppError } from '../../lib/errors';
import { sunCaution } from '../../../shared/sun-proximity';
import { designationKey } from '../../../shared/coordinates';
import { readMeasurementRecords, type ColumnMapping, type NormalisedRow, type RowError } from '../../../shared/file-reading/measurement-file';
import type { Caution } from '../../../shared/schemas/uploads';
import { insertMeasurements, type NewMeasurement } from '../measurements/measurements.repository';
import { addTargetsFromUpload } from '../targets/targets.service';
import type { CsvTable } from '../../../shared/file-reading/text';
import type { Analysis, CommitContext, Imported } from './upload-pipeline';
import type { PreviewState } from './uploads.repository';

/**
 * Measurement files: read every row under a mapping, match the rows to the
 * project's targets (the analysis the preview shows), and import the
 * normalised rows (the commit).
 */

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
  // Looked up once per record: a scan of every error for each record would make an all-wrong 100 000-row file take a minute.
  const targetErrorRows = new Set(targets ? errors.filter((e) => e.column === targets.column).map((e) => e.row) : []);
  const created = new Set<string>();
  let newTargetErrorRows = 0;
  let everyRowKnownTarget = targets !== null && !rowsWithErrors.has(1);
  targets?.texts.forEach((text, i) => {
    const row = i + 2;
    const unreadable = text === '' || targetErrorRows.has(row);
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

/** Reads a measurement file under its mapping and says what a commit would do, row by row. */
export async function analyseMeasurements(db: Db, projectId: number, table: CsvTable, mapping: ColumnMapping, duplicateOf: number | null): Promise<Analysis> {
  const { rows, errors } = readMeasurementRecords(table.headers, table.records, mapping);
  const targets = matchTargets(rows, await projectTargets(db, projectId), errors, recordTargets(table.headers, table.records, mapping));
  return {
    records: table.records,
    errors,
    mapping,
    preview: { headers: table.headers, rows, measurementCount: rows.length, ...targets, duplicateOf, spectrum: null },
  };
}

/** Rows written per step of a commit, so its progress can be followed. */
const ROWS_PER_STEP = 5_000;

/** Creates the new targets (through the targets module, with their trail entries) and inserts the measurements, in the caller's transaction. */
export async function commitMeasurements(trx: Db, ctx: CommitContext, state: PreviewState): Promise<Imported> {
  const { projectId, uploadId, actorUserId, now } = ctx;
  const known = await projectTargets(trx, projectId);
  const firstWithCoords = new Map<string, NormalisedRow>();
  for (const r of state.rows) {
    if (!known.has(r.targetKey) && r.raDeg !== null && !firstWithCoords.has(r.targetKey)) firstWithCoords.set(r.targetKey, r);
  }
  const toCreate = [...firstWithCoords.values()];
  const createdIds = await addTargetsFromUpload(
    trx,
    projectId,
    uploadId,
    toCreate.map((r) => ({ designation: r.target, designationKey: r.targetKey, raDeg: r.raDeg!, decDeg: r.decDeg!, row: r.row })),
    actorUserId,
    now,
  );
  const idOf = (key: string) => known.get(key)?.id ?? createdIds.get(key);
  const measurements: NewMeasurement[] = state.rows.map((r) => {
    const targetId = idOf(r.targetKey);
    if (targetId === undefined) throw new AppError(409, 'conflict', `Target "${r.target}" (row ${r.row}) has no coordinates; preview the file again.`);
    return {
      projectId,
      targetId,
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
  for (let i = 0; i < measurements.length; i += ROWS_PER_STEP) {
    await insertMeasurements(trx, measurements.slice(i, i + ROWS_PER_STEP), now);
    ctx.report({ rowsWritten: Math.min(i + ROWS_PER_STEP, measurements.length) });
  }
  return {
    targetIds: [...new Set(measurements.map((m) => m.targetId))],
    createdTargets: toCreate.map((r) => r.target),
    measurementsAdded: measurements.length,
    targetId: null,
  };
}
