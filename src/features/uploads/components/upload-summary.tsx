import { Link } from 'react-router-dom';
import type { Upload } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { Alert } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { DetailItem, DetailList } from '@/components/ui/detail-list';
import { formatCount, formatDateTime } from '@/lib/format';
import { uploadDownloads } from '../api/keys';
import { formatBytes, UPLOAD_KIND_WORDS, UPLOAD_STATUS_WORDS } from './upload-words';

/**
 * The Sun cautions of a preview, first on the page and in plain words:
 * pointing an instrument at the Sun without a filter blinds in an instant.
 */
export function SunCautions({ upload }: { upload: Pick<Upload, 'cautions'> }) {
  if (upload.cautions.length === 0) return null;
  return (
    <Alert kind="caution" title="Solar danger: a target in this file is the Sun or lies close to it." className="mb-6 border-l-8 text-base" >
      <ul className="mt-1 space-y-1" data-testid="sun-cautions">
        {upload.cautions.map((c, i) => (
          <li key={i}>
            <span className="font-semibold">
              {c.target}
              {c.row !== null ? ` (row ${c.row})` : ''}:
            </span>{' '}
            {c.message}
          </li>
        ))}
      </ul>
    </Alert>
  );
}

/**
 * What the file's rows say about targets, from the same per-row errors the
 * row table shows: a row with errors never counts towards a target created.
 */
function NewTargets({ upload }: { upload: Upload }) {
  const { newTargets, newTargetErrorRows, everyRowKnownTarget } = upload;
  if (newTargets.length === 0 && newTargetErrorRows === 0) {
    return (
      <span className="text-ink-soft" data-testid="new-targets">
        {everyRowKnownTarget ? 'None; every row names a target the project already has.' : 'None: no row free of errors names a new target.'}
      </span>
    );
  }
  return (
    <span className="block space-y-1" data-testid="new-targets">
      {newTargets.length > 0 ? (
        <span className="block">
          {upload.status === 'committed' ? 'Created: ' : 'Committing creates '}
          {formatCount(newTargets.length, 'target')}: {newTargets.join(', ')}
        </span>
      ) : (
        <span className="block">None: no row free of errors names a new target.</span>
      )}
      {newTargetErrorRows > 0 ? (
        <span className="block font-semibold text-alert" data-testid="new-target-error-rows">
          {formatCount(newTargetErrorRows, 'row')} for new targets {newTargetErrorRows === 1 ? 'has errors' : 'have errors'}; {newTargetErrorRows === 1 ? 'it creates' : 'they create'} nothing until fixed.
        </span>
      ) : null}
    </span>
  );
}

/** What the file is and what committing it would do: counts, new targets, and whether the same bytes came before. */
export function UploadSummary({ projectId, upload }: { projectId: number; upload: Upload }) {
  const isSpectrum = upload.kind === 'spectrum';
  return (
    <DetailList>
      <DetailItem label="File">
        <span className="font-semibold">{upload.filename}</span>{' '}
        <span className="text-ink-soft tabular-nums">({formatBytes(upload.sizeBytes)})</span> ·{' '}
        <a className={linkClasses} href={uploadDownloads.file(projectId, upload.id)} download>
          Download the file as sent
        </a>
      </DetailItem>
      <DetailItem label="SHA-256" numeric>
        <span className="font-mono text-xs break-all">{upload.sha256}</span>
      </DetailItem>
      <DetailItem label="Kind">{UPLOAD_KIND_WORDS[upload.kind]}</DetailItem>
      <DetailItem label="Sent">
        {upload.uploadedBy ?? 'A former account'}, {formatDateTime(upload.createdAt)}
      </DetailItem>
      <DetailItem label="Status">
        <span className="font-semibold" data-testid="upload-status">
          {UPLOAD_STATUS_WORDS[upload.status]}
        </span>
        {upload.committedAt ? <span className="text-ink-soft"> · {formatDateTime(upload.committedAt)}</span> : null}
      </DetailItem>
      {!isSpectrum && upload.mapping ? (
        <DetailItem label="Layout">{upload.mapping.layout === 'long' ? 'Long (one measurement per row)' : 'Wide (a column per quantity)'}</DetailItem>
      ) : null}
      <DetailItem label="Rows" numeric>
        {formatCount(upload.rowCount, 'data row')}
      </DetailItem>
      {!isSpectrum ? (
        <DetailItem label="Measurements" numeric>
          {formatCount(upload.measurementCount, 'measurement')} read without error
        </DetailItem>
      ) : null}
      <DetailItem label="Errors" numeric>
        {upload.errorCount === 0 ? (
          'None'
        ) : (
          <span className="font-semibold text-alert" data-testid="error-count">
            {formatCount(upload.errorCount, 'error')}
          </span>
        )}
      </DetailItem>
      {!isSpectrum ? (
        <DetailItem label="New targets">
          <NewTargets upload={upload} />
        </DetailItem>
      ) : null}
      {upload.duplicateOf !== null ? (
        <DetailItem label="Same file before">
          <span className="font-semibold">Yes:</span> these exact bytes were uploaded before as{' '}
          <Link className={linkClasses} to={paths.project.uploadPreview.getHref(projectId, upload.duplicateOf)}>
            upload {upload.duplicateOf}
          </Link>
          .
        </DetailItem>
      ) : null}
    </DetailList>
  );
}
