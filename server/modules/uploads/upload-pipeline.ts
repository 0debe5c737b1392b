import { createHash } from 'node:crypto';
import type { Db } from '../../db/knex';
import { AppError, conflict, validationFailed } from '../../lib/errors';
import { suggestMapping, type ColumnMapping, type RowError } from '../../../shared/file-reading/measurement-file';
import type { CreateUploadFields, Upload, UploadProgress } from '../../../shared/schemas/uploads';
import { appendTrail } from '../trail/trail.repository';
import { rederiveTargets } from '../derived-values/derived-values.service';
import { decodeText, parseCsv, UnreadableFile, type CsvTable } from '../../../shared/file-reading/text';
import { analyseMeasurements, commitMeasurements } from './measurement-import';
import { analyseSpectrum, commitSpectrum } from './spectrum-import';
import {
  dropPreviewRows,
  earlierUploadWithHash,
  insertUpload,
  loadContent,
  loadPreviewState,
  rememberMapping,
  rememberedMapping,
  saveCommitProgress,
  savePreview,
  setUploadStatus,
  type PreviewState,
} from './uploads.repository';

/**
 * The heavy half of an upload — reading the file, checking every row,
 * writing the preview, and the commit with its derivations — as plain
 * functions of a database connection. The upload service runs them through
 * `UploadJobs`: on a worker thread with its own connection in the server, in
 * the same thread for an in-memory test database.
 */

/** What an analysis found: the records as sent, every error, the mapping used and the preview the commit imports. */
export interface Analysis {
  records: string[][];
  errors: RowError[];
  mapping: ColumnMapping | null;
  preview: PreviewState;
}

export interface CommitContext {
  projectId: number;
  uploadId: number;
  actorUserId: number;
  now: Date;
  report(progress: Partial<UploadProgress>): void;
}

/** What one kind of import wrote. */
export interface Imported {
  targetIds: number[];
  createdTargets: string[];
  measurementsAdded: number;
  /** The one target a spectrum belongs to (null for a measurement file, which may touch many). */
  targetId: number | null;
}

export interface PreviewJob {
  projectId: number;
  actorUserId: number;
  filename: string;
  content: Uint8Array;
  fields: CreateUploadFields;
  now: string;
}

export interface RemapJob {
  projectId: number;
  uploadId: number;
  mapping: ColumnMapping;
}

export interface CommitJob {
  projectId: number;
  uploadId: number;
  actorUserId: number;
  now: string;
}

export interface CommitOutcome {
  measurementsAdded: number;
  targetsCreated: string[];
  derivedProposed: number;
}

export type Report = (uploadId: number, progress: Partial<UploadProgress>) => void;

export const headerSignature = (headers: string[]) =>
  createHash('sha256').update(JSON.stringify(headers.map((h) => h.trim().toLowerCase()))).digest('hex');

/** The bytes of an upload as a table; a file that cannot be read is refused on its `file` field. */
export function readTable(bytes: Buffer): CsvTable {
  try {
    return parseCsv(decodeText(bytes));
  } catch (e) {
    if (e instanceof UnreadableFile) throw validationFailed([{ path: 'file', message: e.message }]);
    throw e;
  }
}

async function analyse(
  db: Db,
  projectId: number,
  uploadId: number,
  kind: Upload['kind'],
  table: CsvTable,
  options: { mapping?: ColumnMapping; targetId?: number | null; wavelengthUnit?: CreateUploadFields['wavelengthUnit']; sha256: string },
): Promise<void> {
  const duplicateOf = await earlierUploadWithHash(db, projectId, options.sha256, uploadId);
  const analysis =
    kind === 'spectrum'
      ? await analyseSpectrum(db, projectId, table, { targetId: options.targetId, wavelengthUnit: options.wavelengthUnit, duplicateOf })
      : await analyseMeasurements(
          db,
          projectId,
          table,
          options.mapping ?? (await rememberedMapping(db, projectId, headerSignature(table.headers))) ?? suggestMapping(table.headers),
          duplicateOf,
        );
  await db.transaction((trx) => savePreview(trx, uploadId, analysis));
}

/** Keeps the file byte for byte, reads it and saves the preview; nothing is imported yet. Returns the upload's id. */
export async function runPreview(db: Db, job: PreviewJob): Promise<number> {
  const { projectId, actorUserId, fields } = job;
  const now = new Date(job.now);
  const buffer = Buffer.from(job.content.buffer, job.content.byteOffset, job.content.byteLength);
  // A file that is not text, or has no rows, is refused before anything is stored.
  const table = readTable(buffer);
  const sha256 = createHash('sha256').update(buffer).digest('hex');
  const uploadId = await db.transaction(async (trx) => {
    const id = await insertUpload(
      trx,
      { projectId, userId: actorUserId, kind: fields.kind, filename: job.filename.slice(0, 255), content: buffer, sha256, targetId: fields.targetId ?? null },
      now,
    );
    await appendTrail(trx, { projectId, actorUserId, action: 'upload.received', entityType: 'upload', entityId: id, after: { filename: job.filename, sha256, kind: fields.kind } }, now);
    return id;
  });
  try {
    await analyse(db, projectId, uploadId, fields.kind, table, { mapping: fields.mapping, targetId: fields.targetId, wavelengthUnit: fields.wavelengthUnit, sha256 });
  } catch (e) {
    // A file that cannot be read is discarded at once; the trail says so beside its receipt.
    await db.transaction(async (trx) => {
      await setUploadStatus(trx, uploadId, 'discarded', null);
      await dropPreviewRows(trx, uploadId);
      await appendTrail(
        trx,
        { projectId, actorUserId, action: 'upload.discarded', entityType: 'upload', entityId: uploadId, note: e instanceof AppError ? e.message.slice(0, 500) : '' },
        now,
      );
    });
    throw e;
  }
  return uploadId;
}

/** Reads the kept file again under a new column mapping. */
export async function runRemap(db: Db, job: RemapJob): Promise<void> {
  const stored = await loadContent(db, job.projectId, job.uploadId);
  if (!stored) throw conflict('This upload has no file; upload it again.');
  await analyse(db, job.projectId, job.uploadId, 'measurements', readTable(stored.content), { mapping: job.mapping, sha256: stored.sha256 });
}

/** Targets re-derived per step of a commit, so its progress can be followed. */
const TARGETS_PER_STEP = 250;

/**
 * Imports the whole preview in one transaction — targets, measurements,
 * the upload's status, the trail, the remembered mapping and the new
 * proposed derived values — or nothing. Progress is reported as it goes.
 */
export async function runCommit(db: Db, job: CommitJob, report: Report): Promise<CommitOutcome> {
  const progress = progressWriter(db, job.uploadId, report);
  try {
    const outcome = await commitWhole(db, job, progress.say);
    await progress.finish('done');
    return outcome;
  } catch (e) {
    await progress.finish('failed');
    throw e;
  }
}

/** At most one progress write a second while a commit runs (a phase change is written at once). */
const PROGRESS_WRITE_MS = 1000;

/**
 * Passes each step of a commit to `report` (this process's board) and
 * writes the progress to the upload's row for other processes, outside the
 * commit's transaction and in order, at a modest rate; the final phase is
 * always written. A progress write that fails is logged and never fails
 * the commit.
 */
function progressWriter(db: Db, uploadId: number, report: Report) {
  let current: UploadProgress = { uploadId, phase: 'reading', rowsWritten: 0, rowsTotal: 0, targetsDerived: 0, targetsTotal: 0 };
  let writes: Promise<void> = Promise.resolve();
  let lastWrite = 0;
  const write = (final: boolean) => {
    const snapshot = current;
    lastWrite = Date.now();
    writes = writes.then(() =>
      saveCommitProgress(db, snapshot, final).catch((e: unknown) => {
        console.error('[upload progress]', e instanceof Error ? e.message : String(e));
      }),
    );
  };
  return {
    say(p: Partial<UploadProgress>) {
      const phaseChanged = p.phase !== undefined && p.phase !== current.phase;
      current = { ...current, ...p };
      report(uploadId, p);
      if (phaseChanged || lastWrite === 0 || Date.now() - lastWrite >= PROGRESS_WRITE_MS) write(false);
    },
    async finish(phase: 'done' | 'failed') {
      current = { ...current, phase };
      write(true);
      await writes;
    },
  };
}

async function commitWhole(db: Db, job: CommitJob, say: (p: Partial<UploadProgress>) => void): Promise<CommitOutcome> {
  const { projectId, uploadId, actorUserId } = job;
  const now = new Date(job.now);
  say({ phase: 'reading' });
  const state = await loadPreviewState(db, uploadId);
  if (!state) throw conflict('This upload has no preview; upload the file again.');
  const upload = await db('uploads').where({ id: uploadId }).first('kind', 'filename', 'mapping_json', 'status');
  if (upload?.status !== 'previewed') throw conflict('This upload was committed or discarded meanwhile.');
  const stored = JSON.parse(upload.mapping_json ?? '{}') as Partial<ColumnMapping>;
  const mapping = stored.layout ? (stored as ColumnMapping) : null;
  say({ phase: 'writing', rowsTotal: upload.kind === 'spectrum' ? 2 : state.rows.length });
  const ctx: CommitContext = { projectId, uploadId, actorUserId, now, report: say };
  return db.transaction(async (trx) => {
    const imported = upload.kind === 'spectrum' ? await commitSpectrum(trx, ctx, state) : await commitMeasurements(trx, ctx, state);
    if (mapping) await rememberMapping(trx, projectId, headerSignature(state.headers), mapping, now);
    say({ phase: 'deriving', targetsTotal: imported.targetIds.length, targetsDerived: 0 });
    let proposed = 0;
    for (let i = 0; i < imported.targetIds.length; i += TARGETS_PER_STEP) {
      proposed += (await rederiveTargets(trx, projectId, imported.targetIds.slice(i, i + TARGETS_PER_STEP), actorUserId, now)).proposed;
      say({ targetsDerived: Math.min(i + TARGETS_PER_STEP, imported.targetIds.length) });
    }
    await appendTrail(
      trx,
      {
        projectId,
        actorUserId,
        action: 'upload.committed',
        entityType: 'upload',
        entityId: uploadId,
        // A spectrum belongs to one target; a measurement file may touch many, each with its own entries.
        targetId: imported.targetId,
        after: { filename: upload.filename, measurementsAdded: imported.measurementsAdded, targetsCreated: imported.createdTargets.length, derivedProposed: proposed },
      },
      now,
    );
    // The upload is marked committed last, guarded by its status: a commit or discard that got there first rolls this
    // one back whole. Marked first, its row would stay locked through the commit on PostgreSQL, and the progress written
    // to that row outside the transaction (for other processes to read) would wait behind the lock until the end.
    if ((await setUploadStatus(trx, uploadId, 'committed', now)) === 0) throw conflict('This upload was committed or discarded meanwhile.');
    await dropPreviewRows(trx, uploadId);
    return { measurementsAdded: imported.measurementsAdded, targetsCreated: imported.createdTargets, derivedProposed: proposed };
  });
}
