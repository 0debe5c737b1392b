import type { Db } from '../../db/knex';
import type { ColumnMapping, NormalisedRow, RowError } from '../../../shared/schemas/measurement-file';
import type { Caution, SpectrumPreview, Upload } from '../../../shared/schemas/uploads';
import { parseJson, toIso } from '../../lib/rows';

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
  errors_json: string;
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
  'u.errors_json',
  'u.mapping_json',
  'u.target_id',
  'u.created_at',
  'u.committed_at',
  'users.name as uploaded_by',
];

function toUpload(r: UploadRow, preview: PreviewSummary | null): Upload {
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
    errors: parseJson<RowError[]>(r.errors_json, []),
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

export async function savePreview(
  db: Db,
  uploadId: number,
  p: { rowCount: number; errors: RowError[]; mapping: ColumnMapping | null; preview: PreviewState },
): Promise<void> {
  const { rows, ...summary } = p.preview;
  await db('uploads')
    .where({ id: uploadId })
    .update({
      row_count: p.rowCount,
      error_count: p.errors.length,
      errors_json: JSON.stringify(p.errors),
      mapping_json: JSON.stringify(p.mapping ?? {}),
      summary_json: JSON.stringify(summary),
      preview_json: JSON.stringify(rows),
    });
}

export async function findUpload(db: Db, projectId: number, uploadId: number): Promise<Upload | undefined> {
  const row: UploadRow | undefined = await db('uploads as u')
    .leftJoin('users', 'users.id', 'u.user_id')
    .where({ 'u.project_id': projectId, 'u.id': uploadId })
    .first([...SUMMARY_COLUMNS, 'u.summary_json']);
  if (!row) return undefined;
  const upload = toUpload(row, parseJson<PreviewSummary | null>(row.summary_json, null));
  if (upload.status === 'committed') {
    upload.targets = await db('targets')
      .whereIn('id', db('measurements').where({ upload_id: uploadId }).distinct('target_id'))
      .orderBy('designation_key')
      .select('id', 'designation');
  }
  return upload;
}

export async function loadPreviewState(db: Db, uploadId: number): Promise<PreviewState | null> {
  const row = await db('uploads').where({ id: uploadId }).first('summary_json', 'preview_json');
  const summary = parseJson<PreviewSummary | null>(row?.summary_json, null);
  return summary ? { ...summary, rows: parseJson<NormalisedRow[]>(row?.preview_json, []) } : null;
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
  return rows.map((r) => toUpload(r, null));
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
