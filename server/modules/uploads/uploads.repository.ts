import { gunzipSync, gzipSync } from 'node:zlib';
import { isSqlite, writeUnlessBusy, type Db } from '../../db/knex';
import { bulkInsert } from '../../db/bulk-insert';
import type { ColumnMapping, NormalisedRow, RowError } from '../../../shared/file-reading/measurement-file';
import { ERRORS_SHOWN, type Caution, type DrawnSpectrum, type SpectrumPreview, type Upload, type UploadProgress } from '../../../shared/schemas/uploads';
import { parseJson, toIso } from '../../lib/rows';
import { pointsToDraw } from '../../../shared/schemas/spectrum-drawing';

/** What the preview shows about a file (small; read whenever the upload is shown). */
export interface PreviewSummary {
  headers: string[];
  measurementCount: number;
  newTargets: string[];
  newTargetErrorRows: number;
  everyRowKnownTarget: boolean;
  cautions: Caution[];
  duplicateOf: number | null;
  /** The spectrum as drawn: its fit and every n-th point (its points are kept whole in preview_blob, read only by the commit). */
  spectrum: DrawnSpectrum | null;
}

/** The summary plus what the commit imports (large; read only by the commit): the normalised rows, or the spectrum's every point. */
export interface PreviewState extends Omit<PreviewSummary, 'spectrum'> {
  rows: NormalisedRow[];
  spectrum: SpectrumPreview | null;
}

interface UploadRow {
  id: number;
  project_id: number;
  user_id: number | null;
  kind: Upload['kind'];
  filename: string;
  size_bytes: number;
  sha256: string;
  status: Upload['status'];
  row_count: number;
  error_count: number;
  mapping_json: string;
  summary_json: string | null;
  target_id: number | null;
  created_at: unknown;
  committed_at: unknown;
  uploaded_by?: string | null;
}

const SUMMARY_COLUMNS = [
  'u.id',
  'u.project_id',
  'u.user_id',
  'u.kind',
  'u.filename',
  'u.size_bytes',
  'u.sha256',
  'u.status',
  'u.row_count',
  'u.error_count',
  'u.mapping_json',
  'u.target_id',
  'u.created_at',
  'u.committed_at',
  'users.name as uploaded_by',
];

function toUpload(r: UploadRow, preview: PreviewSummary | null, errors: RowError[]): Upload {
  const mapping = parseJson<ColumnMapping | Record<string, never>>(r.mapping_json, {});
  return {
    id: r.id,
    projectId: r.project_id,
    kind: r.kind,
    filename: r.filename,
    sizeBytes: r.size_bytes,
    sha256: r.sha256,
    status: r.status,
    rowCount: r.row_count,
    measurementCount: preview?.measurementCount ?? 0,
    errorCount: r.error_count,
    errors,
    mapping: 'layout' in mapping ? (mapping as ColumnMapping) : null,
    headers: preview?.headers ?? [],
    newTargets: preview?.newTargets ?? [],
    // Previews saved before these were counted said "every row is known" whenever no target was to be created.
    newTargetErrorRows: preview?.newTargetErrorRows ?? 0,
    everyRowKnownTarget: preview?.everyRowKnownTarget ?? (preview?.newTargets.length === 0 && r.error_count === 0),
    cautions: preview?.cautions ?? [],
    duplicateOf: preview?.duplicateOf ?? null,
    spectrum: preview?.spectrum ?? null,
    targets: [],
    uploadedBy: r.uploaded_by ?? null,
    createdAt: toIso(r.created_at),
    committedAt: r.committed_at == null ? null : toIso(r.committed_at),
  };
}

/** How many files the person uploaded are stored, and their bytes, over all projects. */
export async function storedUploadsOf(db: Db, userId: number): Promise<{ files: number; bytes: number }> {
  const row = await db('uploads').where({ user_id: userId }).first(db.raw('count(*) as files'), db.raw('coalesce(sum(size_bytes), 0) as bytes'));
  return { files: Number(row?.files ?? 0), bytes: Number(row?.bytes ?? 0) };
}

export async function insertUpload(
  db: Db,
  u: { projectId: number; userId: number; kind: Upload['kind']; filename: string; content: Buffer; sha256: string; targetId: number | null },
  at: Date,
): Promise<number> {
  const [row] = await db('uploads')
    .insert({
      project_id: u.projectId,
      user_id: u.userId,
      kind: u.kind,
      filename: u.filename,
      size_bytes: u.content.length,
      sha256: u.sha256,
      content: u.content,
      status: 'previewed',
      target_id: u.targetId,
      created_at: at.toISOString(),
    })
    .returning('id');
  return typeof row === 'object' ? row.id : row;
}

/** Records of the file as sent, per stored chunk; a page of the preview reads the one or two chunks it spans. */
export const CHUNK_ROWS = 500;

const pack = (value: unknown) => gzipSync(JSON.stringify(value), { level: 6 });
const unpack = <T>(blob: Buffer | Uint8Array): T => JSON.parse(gunzipSync(blob).toString('utf8')) as T;

/** The normalised row's fields in a fixed order: the stored preview is arrays of values, not objects repeating their keys. */
const ROW_FIELDS = [
  'row', 'target', 'targetKey', 'raDeg', 'decDeg', 'kind', 'value', 'uncertainty', 'unit', 'valueSi', 'uncertaintySi', 'unitSi',
  'band', 'restWavelengthSi', 'landeG', 'observedAt', 'instrument', 'note', 'extra',
] as const satisfies readonly (keyof NormalisedRow)[];

function packRows(rows: NormalisedRow[]): Buffer {
  return pack(rows.map((r) => ROW_FIELDS.map((f) => r[f])));
}

function unpackRows(blob: Buffer | Uint8Array): NormalisedRow[] {
  return unpack<unknown[][]>(blob).map((values) => Object.fromEntries(ROW_FIELDS.map((f, i) => [f, values[i]])) as unknown as NormalisedRow);
}

/**
 * Replaces an upload's preview in the caller's transaction: the summary, the
 * row errors, the records as sent in compressed chunks, and the normalised
 * rows as one compressed blob.
 */
export async function savePreview(
  trx: Db,
  uploadId: number,
  p: { records: string[][]; errors: RowError[]; mapping: ColumnMapping | null; preview: PreviewState },
): Promise<void> {
  const { rows, spectrum, ...rest } = p.preview;
  const summary: PreviewSummary = { ...rest, spectrum: spectrum && { ...spectrum, points: pointsToDraw(spectrum.points), pointCount: spectrum.points.length } };
  await trx('uploads')
    .where({ id: uploadId })
    .update({
      row_count: p.records.length,
      error_count: p.errors.length,
      errors_json: '[]',
      mapping_json: JSON.stringify(p.mapping ?? {}),
      summary_json: JSON.stringify(summary),
      preview_json: null,
      preview_blob: spectrum ? pack(spectrum.points) : packRows(rows),
    });
  await trx('upload_error_chunks').where({ upload_id: uploadId }).delete();
  await bulkInsert(trx, 'upload_error_chunks', errorChunks(uploadId, p.errors));
  await trx('upload_row_chunks').where({ upload_id: uploadId }).delete();
  const chunks: Record<string, unknown>[] = [];
  for (let i = 0; i * CHUNK_ROWS < p.records.length; i += 1) {
    chunks.push({ upload_id: uploadId, chunk: i, records: pack(p.records.slice(i * CHUNK_ROWS, (i + 1) * CHUNK_ROWS)) });
  }
  await bulkInsert(trx, 'upload_row_chunks', chunks);
}

/** The normalised rows are needed only until the commit: dropped once the upload is committed, discarded or expired. */
export async function dropPreviewRows(db: Db, uploadId: number): Promise<void> {
  await db('uploads').where({ id: uploadId }).update({ preview_blob: null, preview_json: null });
}

/**
 * Row errors are kept in compressed chunks of CHUNK_ROWS lines of the file
 * (migrations/20261202190000_upload_error_chunks.ts says why), each with how
 * many errors it holds and on how many rows, so that a page of errors, or
 * of rows with errors, finds the chunks it spans from those counts and
 * unpacks only them. Chunk −1 holds the errors below row 2 (the header, the
 * file as a whole).
 */
const errorChunkOf = (row: number) => (row < 2 ? -1 : Math.floor((row - 2) / CHUNK_ROWS));

interface ErrorChunkCounts {
  chunk: number;
  error_count: number;
  row_count: number;
}

/** An upload's errors as the chunk rows to store, each chunk's errors in file order (by row, then as found). */
function errorChunks(uploadId: number, errors: RowError[]): Record<string, unknown>[] {
  const byChunk = new Map<number, RowError[]>();
  for (const e of [...errors].sort((a, b) => a.row - b.row)) {
    const error = { row: e.row, column: e.column, message: e.message };
    const list = byChunk.get(errorChunkOf(e.row));
    if (list) list.push(error);
    else byChunk.set(errorChunkOf(e.row), [error]);
  }
  return [...byChunk].map(([chunk, list]) => ({
    upload_id: uploadId,
    chunk,
    error_count: list.length,
    row_count: new Set(list.map((e) => e.row)).size,
    errors: pack(list),
  }));
}

async function errorChunkCounts(db: Db, uploadId: number): Promise<ErrorChunkCounts[]> {
  return db('upload_error_chunks').where({ upload_id: uploadId }).orderBy('chunk').select('chunk', 'error_count', 'row_count');
}

/** The errors of the given chunks, in file order. */
async function errorsOfChunks(db: Db, uploadId: number, chunks: number[]): Promise<RowError[]> {
  if (chunks.length === 0) return [];
  const stored: { chunk: number; errors: Buffer }[] = await db('upload_error_chunks').where({ upload_id: uploadId }).whereIn('chunk', chunks).orderBy('chunk').select('chunk', 'errors');
  return stored.flatMap((c) => unpack<RowError[]>(c.errors));
}

/** The chunks a page of `offset`/`limit` items spans, counting each chunk's items with `size`, and where the first of them starts. */
function chunksSpanned(counts: ErrorChunkCounts[], size: (c: ErrorChunkCounts) => number, page: { offset: number; limit: number }) {
  const chunks: number[] = [];
  let start = 0;
  let firstStart = 0;
  for (const c of counts) {
    const end = start + size(c);
    if (end > page.offset && start < page.offset + page.limit) {
      if (chunks.length === 0) firstStart = start;
      chunks.push(c.chunk);
    }
    start = end;
  }
  return { chunks, firstStart, total: start };
}

/** Row errors in file order, a page at a time. */
export async function listErrors(db: Db, uploadId: number, page: { offset: number; limit: number }): Promise<RowError[]> {
  const { chunks, firstStart } = chunksSpanned(await errorChunkCounts(db, uploadId), (c) => c.error_count, page);
  const errors = await errorsOfChunks(db, uploadId, chunks);
  return errors.slice(page.offset - firstStart, page.offset - firstStart + page.limit);
}

/** The errors of the given rows, for one page of the preview. */
export async function errorsOfRows(db: Db, uploadId: number, fromRow: number, toRow: number): Promise<RowError[]> {
  const counts = await errorChunkCounts(db, uploadId);
  const wanted = counts.map((c) => c.chunk).filter((chunk) => chunk >= errorChunkOf(fromRow) && chunk <= errorChunkOf(toRow));
  return (await errorsOfChunks(db, uploadId, wanted)).filter((e) => e.row >= fromRow && e.row <= toRow);
}

/** Data rows (not the header) that have errors: how many, and one page of their numbers. */
export async function rowsWithErrors(db: Db, uploadId: number, page: { offset: number; limit: number }): Promise<{ total: number; rows: number[] }> {
  const dataChunks = (await errorChunkCounts(db, uploadId)).filter((c) => c.chunk >= 0);
  const { chunks, firstStart, total } = chunksSpanned(dataChunks, (c) => c.row_count, page);
  const rows = [...new Set((await errorsOfChunks(db, uploadId, chunks)).map((e) => e.row))];
  return { total, rows: rows.slice(page.offset - firstStart, page.offset - firstStart + page.limit) };
}

/**
 * The records as sent with the given row numbers (the header is row 1),
 * read from the chunks that hold them; null when the upload has no chunks
 * (stored before they were kept).
 */
export async function recordsOfRows(db: Db, uploadId: number, rowNumbers: number[]): Promise<Map<number, string[]> | null> {
  const wanted = [...new Set(rowNumbers.map((r) => Math.floor((r - 2) / CHUNK_ROWS)))];
  const stored = await db('upload_row_chunks').where({ upload_id: uploadId }).whereIn('chunk', wanted).select('chunk', 'records');
  if (stored.length === 0) {
    const any = await db('upload_row_chunks').where({ upload_id: uploadId }).first('chunk');
    if (!any) return null;
  }
  const byChunk = new Map<number, string[][]>(stored.map((c: { chunk: number; records: Buffer }) => [c.chunk, unpack<string[][]>(c.records)]));
  const out = new Map<number, string[]>();
  for (const row of rowNumbers) {
    const chunk = Math.floor((row - 2) / CHUNK_ROWS);
    const record = byChunk.get(chunk)?.[(row - 2) % CHUNK_ROWS];
    if (record) out.set(row, record);
  }
  return out;
}

export async function findUpload(db: Db, projectId: number, uploadId: number): Promise<Upload | undefined> {
  const row: UploadRow | undefined = await db('uploads as u')
    .leftJoin('users', 'users.id', 'u.user_id')
    .where({ 'u.project_id': projectId, 'u.id': uploadId })
    .first([...SUMMARY_COLUMNS, 'u.summary_json']);
  if (!row) return undefined;
  const upload = toUpload(row, parseJson<PreviewSummary | null>(row.summary_json, null), await firstErrors(db, row));
  if (upload.status === 'committed') {
    upload.targets = await db('targets')
      .whereIn('id', db('measurements').where({ upload_id: uploadId }).distinct('target_id'))
      .orderBy('designation_key')
      .select('id', 'designation');
  }
  return upload;
}

/**
 * The first ERRORS_SHOWN errors of each of the given uploads, in two
 * queries whatever their number: every upload's chunk counts, then only the
 * chunks that hold its first errors.
 */
async function firstErrorsOf(db: Db, uploadIds: number[]): Promise<Map<number, RowError[]>> {
  const first = new Map<number, RowError[]>();
  if (uploadIds.length === 0) return first;
  const counts: (ErrorChunkCounts & { upload_id: number })[] = await db('upload_error_chunks')
    .whereIn('upload_id', uploadIds)
    .orderBy([{ column: 'upload_id' }, { column: 'chunk' }])
    .select('upload_id', 'chunk', 'error_count', 'row_count');
  const wanted: [number, number][] = [];
  const seen = new Map<number, number>();
  for (const c of counts) {
    const before = seen.get(c.upload_id) ?? 0;
    if (before < ERRORS_SHOWN) wanted.push([c.upload_id, c.chunk]);
    seen.set(c.upload_id, before + c.error_count);
  }
  if (wanted.length === 0) return first;
  const stored: { upload_id: number; errors: Buffer }[] = await db('upload_error_chunks')
    .whereIn(['upload_id', 'chunk'], wanted)
    .orderBy([{ column: 'upload_id' }, { column: 'chunk' }])
    .select('upload_id', 'errors');
  for (const c of stored) first.set(c.upload_id, [...(first.get(c.upload_id) ?? []), ...unpack<RowError[]>(c.errors)].slice(0, ERRORS_SHOWN));
  return first;
}

/** The first few errors shown with an upload; the rest are paged from their own route. */
async function firstErrors(db: Db, row: UploadRow): Promise<RowError[]> {
  if (row.error_count === 0) return [];
  const errors = (await firstErrorsOf(db, [row.id])).get(row.id) ?? [];
  if (errors.length) return errors;
  // Uploads previewed before errors had their own table kept them as one JSON list.
  const old = await db('uploads').where({ id: row.id }).first('errors_json');
  return parseJson<RowError[]>(old?.errors_json, []).slice(0, ERRORS_SHOWN);
}

export async function loadPreviewState(db: Db, uploadId: number): Promise<PreviewState | null> {
  const row = await db('uploads').where({ id: uploadId }).first('summary_json', 'preview_blob', 'preview_json');
  const summary = parseJson<PreviewSummary | null>(row?.summary_json, null);
  if (!summary) return null;
  if (summary.spectrum) {
    // Its points are dropped with the preview (committed, discarded or expired): nothing is left to commit.
    if (!row.preview_blob) return null;
    const { pointCount: _, ...drawn } = summary.spectrum;
    return { ...summary, rows: [], spectrum: { ...drawn, points: unpack<[number, number][]>(row.preview_blob) } };
  }
  // Previews saved before the compact form kept their rows as JSON.
  const rows = row.preview_blob ? unpackRows(row.preview_blob) : parseJson<NormalisedRow[]>(row.preview_json, []);
  return { ...summary, rows, spectrum: null };
}

export async function loadContent(db: Db, projectId: number, uploadId: number): Promise<{ filename: string; content: Buffer; sha256: string } | undefined> {
  const row = await db('uploads').where({ project_id: projectId, id: uploadId }).first('filename', 'content', 'sha256');
  return row ? { filename: row.filename, content: Buffer.from(row.content), sha256: row.sha256 } : undefined;
}

export async function listUploads(db: Db, projectId: number): Promise<Upload[]> {
  const rows: UploadRow[] = await db('uploads as u')
    .leftJoin('users', 'users.id', 'u.user_id')
    .where('u.project_id', projectId)
    .orderBy('u.id', 'desc')
    .select(SUMMARY_COLUMNS);
  const first = await firstErrorsOf(db, rows.filter((r) => r.error_count > 0).map((r) => r.id));
  return rows.map((r) => toUpload(r, null, first.get(r.id) ?? []));
}

/** Previewed uploads received before `before`: abandoned previews whose rows are to be dropped. */
export async function abandonedPreviews(db: Db, before: Date, limit: number): Promise<{ id: number; projectId: number; filename: string }[]> {
  const rows = await db('uploads').where({ status: 'previewed' }).where('created_at', '<', before.toISOString()).orderBy('id').limit(limit).select('id', 'project_id', 'filename');
  return rows.map((r: { id: number; project_id: number; filename: string }) => ({ id: r.id, projectId: r.project_id, filename: r.filename }));
}

export async function earlierUploadWithHash(db: Db, projectId: number, sha256: string, exceptId: number): Promise<number | null> {
  const row = await db('uploads')
    .where({ project_id: projectId, sha256 })
    .whereNot('id', exceptId)
    .whereIn('status', ['previewed', 'committed'])
    .orderBy([{ column: 'status', order: 'asc' }, { column: 'id', order: 'asc' }])
    .first('id');
  return row?.id ?? null;
}

export async function setUploadStatus(db: Db, uploadId: number, status: Upload['status'], at: Date | null): Promise<number> {
  return db('uploads')
    .where({ id: uploadId, status: 'previewed' })
    .update({ status, ...(at ? { committed_at: at.toISOString() } : {}) });
}

export async function rememberMapping(db: Db, projectId: number, signature: string, mapping: ColumnMapping, at: Date): Promise<void> {
  await db('column_mappings')
    .insert({ project_id: projectId, header_signature: signature, mapping_json: JSON.stringify(mapping), updated_at: at.toISOString() })
    .onConflict(['project_id', 'header_signature'])
    .merge();
}

export async function rememberedMapping(db: Db, projectId: number, signature: string): Promise<ColumnMapping | null> {
  const row = await db('column_mappings').where({ project_id: projectId, header_signature: signature }).first('mapping_json');
  return row ? parseJson<ColumnMapping | null>(row.mapping_json, null) : null;
}

/**
 * Writes where an upload's commit has got to, outside the commit's
 * transaction, for app processes other than the one running it (on
 * PostgreSQL). On SQLite one process runs the app and answers from its own
 * board while the commit runs, and the commit holds the one write lock (in
 * a test, the one connection) until it ends: there only the final state is
 * written, and skipped if another writer holds the lock.
 */
export async function saveCommitProgress(db: Db, progress: UploadProgress, final: boolean): Promise<void> {
  if (isSqlite(db) && !final) return;
  await writeUnlessBusy(db, 'update uploads set commit_progress_json = ? where id = ?', [JSON.stringify(progress), progress.uploadId]);
}

/** The commit progress last written for an upload, or null when none was. */
export async function loadCommitProgress(db: Db, uploadId: number): Promise<UploadProgress | null> {
  const row = await db('uploads').where({ id: uploadId }).first('commit_progress_json');
  return row?.commit_progress_json ? parseJson<UploadProgress | null>(row.commit_progress_json, null) : null;
}
