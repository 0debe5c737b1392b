import { useId, useState } from 'react';
import type { RowError } from '@shared/file-reading/measurement-file';
import { StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { Button } from '@/components/ui/button';
import { CheckboxField } from '@/components/ui/field';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { cn } from '@/lib/cn';
import { formatCount } from '@/lib/format';
import { useUploadRows } from '../api/get-upload-rows';

const PAGE_SIZE = 50;

/** A cell as sent, with its errors written underneath: outlined and labelled, so the problem does not rest on colour. */
function Cell({ text, errors }: { text: string; errors: RowError[] }) {
  const bad = errors.length > 0;
  return (
    <LedgerCell
      className={cn('font-mono text-xs whitespace-pre', bad && 'outline-2 -outline-offset-2 outline-alert outline-dashed bg-paper-deep')}
      data-error={bad ? 'true' : undefined}
    >
      {/* An empty cell stays blank (screen readers announce it as blank); a positioned sr-only label would widen the page. */}
      {text === '' ? null : <span>{text}</span>}
      {errors.map((e, i) => (
        <span key={i} className="mt-1 block w-56 font-sans text-xs whitespace-normal text-alert" role="note">
          <span className="font-semibold">Error:</span> {e.message}
        </span>
      ))}
    </LedgerCell>
  );
}

/**
 * Every row of the file as it was sent, a page at a time, with each error at
 * the cell it concerns. Errors that belong to no one cell (a row too long, a
 * field the file has no column for) are listed at the end of their row.
 */
export function PreviewTable({ projectId, uploadId, errorCount }: { projectId: number; uploadId: number; errorCount: number }) {
  const [page, setPage] = useState(1);
  const [onlyErrors, setOnlyErrors] = useState(false);
  const rows = useUploadRows(projectId, uploadId, { page, pageSize: PAGE_SIZE, onlyErrors });
  const captionId = useId();

  if (rows.isPending) return <StatusLine>Loading the rows…</StatusLine>;
  if (rows.isError) return <QueryError what="The rows" error={rows.error} onRetry={() => void rows.refetch()} />;

  const { headers, total } = rows.data;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const hasLoose = rows.data.rows.some((r) => r.errors.some((e) => !headers.includes(e.column)));
  const first = total === 0 ? 0 : (page - 1) * PAGE_SIZE + 1;
  const last = Math.min(total, page * PAGE_SIZE);

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <CheckboxField
          label="Show only rows with errors"
          checked={onlyErrors}
          disabled={errorCount === 0 && !onlyErrors}
          onChange={(e) => {
            setOnlyErrors(e.target.checked);
            setPage(1);
          }}
          hint={errorCount === 0 ? 'No row has an error.' : undefined}
        />
        <p id={captionId} className="text-sm text-ink-soft tabular-nums" aria-live="polite">
          {total === 0
            ? onlyErrors
              ? 'No row has an error.'
              : 'The file has no data rows.'
            : `Rows ${first}–${last} of ${formatCount(total, onlyErrors ? 'row with errors' : 'row', onlyErrors ? 'rows with errors' : 'rows')}`}
          {rows.isFetching ? ' · loading…' : ''}
        </p>
      </div>
      {total > 0 ? (
        <LedgerTable aria-describedby={captionId} aria-label="Rows of the file as sent" data-testid="preview-table">
          <LedgerHead>
            <tr>
              <LedgerHeaderCell scope="col" numeric>
                Row
              </LedgerHeaderCell>
              {headers.map((h, i) => (
                <LedgerHeaderCell key={i} scope="col" className="font-mono">
                  {h}
                </LedgerHeaderCell>
              ))}
              {hasLoose ? <LedgerHeaderCell scope="col">Other problems in the row</LedgerHeaderCell> : null}
            </tr>
          </LedgerHead>
          <LedgerBody>
            {rows.data.rows.map((r) => {
              const loose = r.errors.filter((e) => !headers.includes(e.column));
              return (
                <LedgerRow key={r.row} data-row={r.row}>
                  <LedgerCell numeric>
                    <span className="font-semibold">{r.row}</span>
                    {r.errors.length > 0 ? <span className="block text-xs text-alert">{formatCount(r.errors.length, 'error')}</span> : null}
                  </LedgerCell>
                  {headers.map((h, i) => (
                    <Cell key={i} text={r.cells[i] ?? ''} errors={r.errors.filter((e) => e.column === h)} />
                  ))}
                  {hasLoose ? (
                    <LedgerCell className="text-xs">
                      {loose.map((e, i) => (
                        <span key={i} className="block w-64 text-alert">
                          <span className="font-semibold">Error{e.column ? ` (${e.column})` : ''}:</span> {e.message}
                        </span>
                      ))}
                    </LedgerCell>
                  ) : null}
                </LedgerRow>
              );
            })}
          </LedgerBody>
        </LedgerTable>
      ) : null}
      {pages > 1 ? (
        <nav aria-label="Pages of rows" className="mt-3 flex items-center gap-3 text-sm">
          <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
            Previous page
          </Button>
          <span className="tabular-nums">
            Page {page} of {pages}
          </span>
          <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Next page
          </Button>
        </nav>
      ) : null}
    </div>
  );
}
