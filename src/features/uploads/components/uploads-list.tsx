import { Link } from 'react-router-dom';
import type { Upload } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { formatDateTime } from '@/lib/format';
import { uploadDownloads } from '../api/keys';
import { formatBytes, UPLOAD_KIND_WORDS, UPLOAD_STATUS_WORDS } from './upload-words';

/** Every file the project received, newest first: who sent it, what became of it, and the file itself. */
export function UploadsList({ projectId, uploads }: { projectId: number; uploads: Upload[] }) {
  return (
    <LedgerTable aria-label="Uploads" data-testid="uploads-table">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col" numeric>
            No.
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Sent</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">By</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">File</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Kind</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Rows
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Status</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Errors
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">
            <span className="sr-only">Preview</span>
          </LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {uploads.map((u) => (
          <LedgerRow key={u.id} data-upload={u.id}>
            <LedgerCell numeric>{u.id}</LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">{formatDateTime(u.createdAt)}</LedgerCell>
            <LedgerCell>{u.uploadedBy ?? <span className="text-ink-soft italic">a former account</span>}</LedgerCell>
            <LedgerCell>
              <a className={linkClasses} href={uploadDownloads.file(projectId, u.id)} download>
                {u.filename}
              </a>
              <span className="block text-xs text-ink-soft tabular-nums">{formatBytes(u.sizeBytes)} · download as sent</span>
            </LedgerCell>
            <LedgerCell>{UPLOAD_KIND_WORDS[u.kind]}</LedgerCell>
            <LedgerCell numeric>{u.rowCount}</LedgerCell>
            <LedgerCell>
              <span className={u.status === 'committed' ? 'font-semibold' : undefined}>{UPLOAD_STATUS_WORDS[u.status]}</span>
              {u.committedAt ? <span className="block text-xs text-ink-soft tabular-nums">{formatDateTime(u.committedAt)}</span> : null}
            </LedgerCell>
            <LedgerCell numeric>{u.errorCount === 0 ? 'none' : <span className="font-semibold text-alert">{u.errorCount}</span>}</LedgerCell>
            <LedgerCell>
              <Link className={linkClasses} to={paths.project.uploadPreview.getHref(projectId, u.id)}>
                {u.status === 'previewed' ? 'Open the preview' : 'Details'}
              </Link>
            </LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
