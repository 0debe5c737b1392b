import { gunzipSync, gzipSync } from 'node:zlib';
import type { Db } from '../../db/knex';
import { bulkInsert } from '../../db/bulk-insert';
import type { ColumnMapping, NormalisedRow, RowError } from '../../../shared/file-reading/measurement-file';
import { ERRORS_SHOWN, type Caution, type SpectrumPreview, type Upload } from '../../../shared/schemas/uploads';
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
  spectrum: SpectrumPreview | null;
}

/** The summary plus the normalised rows the commit imports (large; read only by the commit). */
export interface PreviewState extends PreviewSummary {
  rows: NormalisedRow[];
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
    spectrum: preview?.spectrum ? { ...preview.spectrum, points: pointsToDraw(preview.spectrum.points), pointCount: preview.spectrum.points.length } : null,
    targets: [],
    uploadedBy: r.uploaded_by ?? null,
    createdAt: toIso(r.created_at),
    committedAt: r.committed_at == null ? null : toIso(r.committed_at),
  };
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
  const { rows, ...summary } = p.preview;
  await trx('uploads')
    .where({ id: uploadId })
    .update({
      row_count: p.records.length,
      error_count: p.errors.length,
      errors_json: '[]',
      mapping_json: JSON.stringify(p.mapping ?? {}),
      summary_json: JSON.stringify(summary),
      preview_json: null,
      preview_blob: packRows(rows),
    });
  await trx('upload_errors').where({ upload_id: uploadId }).delete();
  await bulkInsert(trx, 'upload_errors', p.errors.map((e) => ({ upload_id: uploadId, row: e.row, column: e.column.slice(0, 255), message: e.message })));
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

/** Row errors in file order, a page at a time. */
export async function listErrors(db: Db, uploadId: number, page: { offset: number; limit: number }): Promise<RowError[]> {
  return db('upload_errors')
    .where({ upload_id: uploadId })
    .orderBy([{ column: 'row' }, { column: 'id' }])
    .offset(page.offset)
    .limit(page.limit)
    .select('row', 'column', 'message');
}

/** The errors of the given rows, for one page of the preview. */
export async function errorsOfRows(db: Db, uploadId: number, fromRow: number, toRow: number): Promise<RowError[]> {
  return db('upload_errors')
    .where({ upload_id: uploadId })
    .whereBetween('row', [fromRow, toRow])
    .orderBy([{ column: 'row' }, { column: 'id' }])
    .select('row', 'column', 'message');
}

/** Data rows (not the header) that have errors: how many, and one page of their numbers. */
export async function rowsWithErrors(db: Db, uploadId: number, page: { offset: number; limit: number }): Promise<{ total: number; rows: number[] }> {
  const base = () => db('upload_errors').where({ upload_id: uploadId }).where('row', '>=', 2);
  const counted = await base().countDistinct<{ n: number | string }[]>('row as n');
  const rows = await base().distinct('row').orderBy('row').offset(page.offset).limit(page.limit);
  return { total: Number(counted[0]?.n ?? 0), rows: rows.map((r: { row: number }) => r.row) };
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

/** The first few errors shown with an upload; the rest are paged from their own route. */
async function firstErrors(db: Db, row: UploadRow): Promise<RowError[]> {
  if (row.error_count === 0) return [];
  const errors = await listErrors(db, row.id, { offset: 0, limit: ERRORS_SHOWN });
  if (errors.length) return errors;
  // Uploads previewed before errors had their own table kept them as one JSON list.
  const old = await db('uploads').where({ id: row.id }).first('errors_json');
  return parseJson<RowError[]>(old?.errors_json, []).slice(0, ERRORS_SHOWN);
}

export async function loadPreviewState(db: Db, uploadId: number): Promise<PreviewState | null> {
  const row = await db('uploads').where({ id: uploadId }).first('summary_json', 'preview_blob', 'preview_json');
  const summary = parseJson<PreviewSummary | null>(row?.summary_json, null);
  if (!summary) return null;
  // Previews saved before the compact form kept their rows as JSON.
  const rows = row.preview_blob ? unpackRows(row.preview_blob) : parseJson<NormalisedRow[]>(row.preview_json, []);
  return { ...summary, rows };
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
  const withErrors = rows.filter((r) => r.error_count > 0).map((r) => r.id);
  const first = new Map<number, RowError[]>();
  if (withErrors.length) {
    // The first few errors of each upload, by their place in the file, in one query.
    const ranked = await db
      .select('upload_id', 'row', 'column', 'message')
      .from(
        db('upload_errors')
          .whereIn('upload_id', withErrors)
          .select('upload_id', 'row', 'column', 'message', db.raw('row_number() over (partition by upload_id order by "row", id) as n'))
          .as('e'),
      )
      .where('n', '<=', ERRORS_SHOWN)
      .orderBy([{ column: 'upload_id' }, { column: 'n' }]);
    for (const e of ranked as (RowError & { upload_id: number })[]) {
      first.set(e.upload_id, [...(first.get(e.upload_id) ?? []), { row: e.row, column: e.column, message: e.message }]);
    }
  }
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
