import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { AppError, conflict, notFound, validationFailed } from '../../lib/errors';
import type { ColumnMapping, RowError } from '../../../shared/file-reading/measurement-file';
import type { CreateUploadFields, Upload, UploadErrorsPage, UploadProgress, UploadRowsPage } from '../../../shared/schemas/uploads';
import { appendTrail } from '../trail/trail.repository';
import { spectrumTarget } from './spectrum-import';
import { inlineUploadJobs, type UploadJobs } from './upload-jobs';
import { readTable } from './upload-pipeline';
import {
  abandonedPreviews,
  dropPreviewRows,
  errorsOfRows,
  findUpload,
  listErrors,
  listUploads,
  loadCommitProgress,
  loadContent,
  recordsOfRows,
  rowsWithErrors,
  setUploadStatus,
  storedUploadsOf,
} from './uploads.repository';

export interface IncomingFile {
  originalname: string;
  buffer: Buffer;
}

export interface UploadsOptions {
  /** Where reading and committing run (a worker thread in the server); in this thread when omitted. */
  jobs?: UploadJobs;
  /** Megabytes of uploaded files one person may have stored over every project (ASVS 12.1.3); no limit when omitted. */
  quotaMb?: number;
  /** How many uploaded files one person may have stored over every project (ASVS 12.1.3); no limit when omitted. */
  quotaFiles?: number;
}

/**
 * The upload service orchestrates: it checks what can be checked cheaply
 * here, hands reading and committing to the pipeline (`upload-pipeline.ts`,
 * run through `UploadJobs`), and answers the upload's views from what the
 * pipeline stored.
 */
export function createUploadsService(db: Db, clock: Clock, options: UploadsOptions = {}) {
  const jobs = options.jobs ?? inlineUploadJobs(db);

  const quotaBytes = options.quotaMb === undefined ? Infinity : options.quotaMb * 1024 * 1024;
  const quotaFiles = options.quotaFiles ?? Infinity;

  /**
   * Refuses, before anything is stored, a file that would take the person's
   * stored uploads (every project's, committed, previewed or discarded: each
   * keeps its file) past the quota of bytes or of files. Two uploads of one
   * person racing may both pass; the quota bounds growth, it is not an exact
   * ledger.
   */
  async function withinQuota(userId: number, bytes: number): Promise<void> {
    if (quotaBytes === Infinity && quotaFiles === Infinity) return;
    const used = await storedUploadsOf(db, userId);
    const refuse = (message: string) => new AppError(413, 'upload_quota_exceeded', message, [{ path: 'file', message }]);
    const after = 'Nothing was stored. Ask the site admin to raise the quota.';
    if (used.files + 1 > quotaFiles) throw refuse(`Your uploads already keep ${used.files} files, the most each person may store. ${after}`);
    if (used.bytes + bytes > quotaBytes) {
      const mb = (n: number) => `${(n / 1024 / 1024).toFixed(1)} MB`;
      throw refuse(`This file (${mb(bytes)}) does not fit: your uploads already keep ${mb(used.bytes)} of the ${mb(quotaBytes)} each person may store. ${after}`);
    }
  }

  async function get(projectId: number, uploadId: number): Promise<Upload> {
    const upload = await findUpload(db, projectId, uploadId);
    if (!upload) throw notFound('No such upload in this project.');
    return upload;
  }

  /**
   * Discards a preview and writes its trail entry, or does nothing when the
   * upload is no longer a preview: the status changes by compare-and-set in
   * the transaction, so of two processes (or a discard and an expiry) racing
   * for one preview exactly one writes the entry. Returns whether this one did.
   */
  async function discardWithTrail(upload: Upload, actorUserId: number | null, action: 'upload.discarded' | 'upload.expired', note = ''): Promise<boolean> {
    return db.transaction(async (trx) => {
      if ((await setUploadStatus(trx, upload.id, 'discarded', null)) === 0) return false;
      await dropPreviewRows(trx, upload.id);
      await appendTrail(
        trx,
        {
          projectId: upload.projectId,
          actorUserId,
          action,
          entityType: 'upload',
          entityId: upload.id,
          targetId: upload.spectrum?.targetId ?? null,
          before: { filename: upload.filename, status: upload.status },
          note,
        },
        clock.now(),
      );
      return true;
    });
  }

  return {
    get,
    list: (projectId: number) => listUploads(db, projectId),

    /** Keeps the file byte for byte, reads it and saves the preview; nothing is imported yet. */
    async preview(projectId: number, actorUserId: number, file: IncomingFile | undefined, fields: CreateUploadFields): Promise<Upload> {
      if (!file) throw validationFailed([{ path: 'file', message: 'Choose a file to upload (form field "file").' }]);
      // Checked before anything is stored: the upload row refers to the target.
      if (fields.kind === 'spectrum') await spectrumTarget(db, projectId, fields.targetId);
      await withinQuota(actorUserId, file.buffer.length);
      const uploadId = await jobs.preview({ projectId, actorUserId, filename: file.originalname, content: file.buffer, fields, now: clock.now().toISOString() });
      return get(projectId, uploadId);
    },

    /** Reads the kept file again under a new column mapping. */
    async remap(projectId: number, uploadId: number, mapping: ColumnMapping): Promise<Upload> {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is ${upload.status}; upload the file again to change its mapping.`);
      if (upload.kind !== 'measurements') throw conflict('A spectrum has no column mapping.');
      await jobs.remap({ projectId, uploadId, mapping });
      return get(projectId, uploadId);
    },

    /** Every error of an upload, a page at a time, in file order. */
    async errors(projectId: number, uploadId: number, query: { page: number; pageSize: number }): Promise<UploadErrorsPage> {
      const upload = await get(projectId, uploadId);
      const errors = await listErrors(db, uploadId, { offset: (query.page - 1) * query.pageSize, limit: query.pageSize });
      return { errors, total: upload.errorCount, page: query.page, pageSize: query.pageSize };
    },

    /** One page of the file as sent, each row with its errors, for the preview table; reads only the chunks the page spans. */
    async rows(projectId: number, uploadId: number, query: { page: number; pageSize: number; onlyErrors: boolean }): Promise<UploadRowsPage> {
      const upload = await get(projectId, uploadId);
      const offset = (query.page - 1) * query.pageSize;
      let total: number;
      let numbers: number[];
      if (query.onlyErrors) {
        ({ total, rows: numbers } = await rowsWithErrors(db, uploadId, { offset, limit: query.pageSize }));
      } else {
        total = upload.rowCount;
        numbers = Array.from({ length: Math.max(0, Math.min(query.pageSize, total - offset)) }, (_, i) => offset + i + 2);
      }
      let records = await recordsOfRows(db, uploadId, numbers);
      if (!records) {
        // Uploads stored before their records were kept in chunks: read the file itself.
        const stored = await loadContent(db, projectId, uploadId);
        const table = readTable(stored!.content);
        records = new Map(numbers.map((n) => [n, table.records[n - 2] ?? []]));
      }
      const errorsByRow = new Map<number, RowError[]>();
      if (numbers.length) {
        for (const e of await errorsOfRows(db, uploadId, numbers[0], numbers[numbers.length - 1])) errorsByRow.set(e.row, [...(errorsByRow.get(e.row) ?? []), e]);
      }
      return {
        headers: upload.headers,
        rows: numbers.map((row) => ({ row, cells: records.get(row) ?? [], errors: errorsByRow.get(row) ?? [] })),
        total,
        page: query.page,
        pageSize: query.pageSize,
      };
    },

    /**
     * Where a commit under way has got to: from this process's board when
     * the commit runs here, else as the process running it last wrote it
     * to the database (null when no commit was asked for).
     */
    async progress(projectId: number, uploadId: number): Promise<UploadProgress | null> {
      await get(projectId, uploadId);
      return jobs.progress(uploadId) ?? (await loadCommitProgress(db, uploadId));
    },

    /**
     * Imports the whole preview in one transaction, or nothing; the work
     * runs in the pipeline while this request waits without holding up others.
     */
    async commit(projectId: number, uploadId: number, actorUserId: number, confirmDuplicate: boolean) {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is already ${upload.status}.`);
      if (upload.errorCount > 0) {
        throw new AppError(422, 'validation_failed', `The file has ${upload.errorCount} error(s); fix them and upload it again. Nothing was imported.`, upload.errors);
      }
      if (upload.duplicateOf && !confirmDuplicate) {
        throw conflict(`The same file was uploaded before (upload ${upload.duplicateOf}). Commit again with confirmDuplicate to import it a second time.`, [
          { path: 'confirmDuplicate', message: `Same bytes as upload ${upload.duplicateOf}.` },
        ]);
      }
      const result = await jobs.commit({ projectId, uploadId, actorUserId, now: clock.now().toISOString() });
      const committed = await get(projectId, uploadId);
      return { upload: committed, ...result, targets: committed.targets };
    },

    async discard(projectId: number, uploadId: number, actorUserId: number): Promise<Upload> {
      const upload = await get(projectId, uploadId);
      if (upload.status !== 'previewed') throw conflict(`This upload is already ${upload.status}.`);
      await discardWithTrail(upload, actorUserId, 'upload.discarded');
      return get(projectId, uploadId);
    },

    /**
     * Previews left uncommitted longer than `maxAgeMs` are discarded: their
     * normalised rows are dropped, the file and its errors stay, and the
     * trail says the preview expired. Returns how many.
     */
    async expirePreviews(maxAgeMs: number): Promise<number> {
      let expired = 0;
      for (;;) {
        const batch = await abandonedPreviews(db, new Date(clock.now().getTime() - maxAgeMs), 100);
        if (batch.length === 0) return expired;
        for (const a of batch) {
          const upload = await get(a.projectId, a.id);
          if (await discardWithTrail(upload, null, 'upload.expired', `Not committed within ${Math.round(maxAgeMs / 3_600_000)} h; the file is kept.`)) expired += 1;
        }
        if (batch.length < 100) return expired;
      }
    },

    async raw(projectId: number, uploadId: number) {
      const stored = await loadContent(db, projectId, uploadId);
      if (!stored) throw notFound('No such upload in this project.');
      return stored;
    },
  };
}

export type UploadsService = ReturnType<typeof createUploadsService>;
