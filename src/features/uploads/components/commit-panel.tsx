import { useId, useState } from 'react';
import type { CommitResult, Upload } from '@shared/schemas/uploads';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { CheckboxField } from '@/components/ui/field';
import { formatCount } from '@/lib/format';
import { useCommitUpload } from '../api/commit-upload';
import { useDiscardUpload } from '../api/discard-upload';
import { useUploadProgress } from '../api/get-upload-progress';
import { CommitProgress } from './commit-progress';

/** Why the commit button is off, in words, or null when it may be pressed. */
function blockedBecause(upload: Upload, confirmDuplicate: boolean): string | null {
  if (upload.errorCount > 0) {
    const fix =
      upload.kind === 'measurements'
        ? 'If a column was read as the wrong thing, change the column mapping above; otherwise correct the file and upload it again.'
        : 'Correct the file and upload it again.';
    return `The file has ${formatCount(upload.errorCount, 'error')}, and an upload is imported whole or not at all. ${fix}`;
  }
  if (upload.kind === 'measurements' && upload.measurementCount === 0) return 'The file has no measurements to import.';
  if (upload.kind === 'spectrum' && !upload.spectrum?.fit) return 'The spectrum has no Planck fit to record.';
  if (upload.duplicateOf !== null && !confirmDuplicate) {
    return `These exact bytes were uploaded before (upload ${upload.duplicateOf}). Importing them again doubles every measurement; tick “Import it again anyway” if that is what you mean.`;
  }
  return null;
}

/**
 * Commit all or nothing, or discard. The commit stays off while any row has
 * an error, and says why; a file sent before needs an explicit tick.
 */
export function CommitPanel({
  projectId,
  upload,
  onCommitted,
  onDiscarded,
  onDataChanged,
}: {
  projectId: number;
  upload: Upload;
  onCommitted: (result: CommitResult) => void;
  onDiscarded: () => void;
  /** Targets, measurements and derived values changed: the page refreshes what other features show. */
  onDataChanged: () => void;
}) {
  const [confirmDuplicate, setConfirmDuplicate] = useState(false);
  const [discarding, setDiscarding] = useState(false);
  const commit = useCommitUpload(projectId, upload.id, onDataChanged);
  const discard = useDiscardUpload(projectId, upload.id);
  const progress = useUploadProgress(projectId, upload.id, commit.isPending);
  const reasonId = useId();
  const blocked = blockedBecause(upload, confirmDuplicate);
  const busy = commit.isPending || discard.isPending;
  const label =
    upload.kind === 'spectrum'
      ? upload.spectrum?.fit && upload.spectrum.fit.peakWavelengthM == null
        ? 'Commit the Planck temperature (1 measurement)'
        : 'Commit the spectrum fit (2 measurements)'
      : `Commit all ${new Intl.NumberFormat('en-GB').format(upload.measurementCount)} measurement${upload.measurementCount === 1 ? '' : 's'}`;

  return (
    <div className="space-y-4" data-print="hide">
      {upload.duplicateOf !== null && upload.errorCount === 0 ? (
        <CheckboxField
          label="Import it again anyway"
          checked={confirmDuplicate}
          disabled={busy}
          onChange={(e) => setConfirmDuplicate(e.target.checked)}
          hint={`Same bytes as upload ${upload.duplicateOf}.`}
        />
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button
          disabled={blocked !== null || busy}
          aria-describedby={blocked ? reasonId : undefined}
          onClick={() => commit.mutate({ confirmDuplicate }, { onSuccess: onCommitted })}
        >
          {commit.isPending ? 'Committing…' : label}
        </Button>
        {discarding ? (
          <div role="group" aria-label="Confirm discarding" className="flex flex-wrap items-center gap-3 rounded-sm border border-alert bg-paper-deep px-3 py-2 text-sm">
            <p>Discard this upload? Nothing from it is imported; the file stays in the history, marked discarded.</p>
            <Button variant="danger" disabled={busy} onClick={() => discard.mutate(undefined, { onSuccess: onDiscarded })}>
              {discard.isPending ? 'Discarding…' : 'Yes, discard it'}
            </Button>
            <Button variant="secondary" disabled={busy} onClick={() => setDiscarding(false)}>
              Keep the preview
            </Button>
          </div>
        ) : (
          <Button variant="danger" disabled={busy} onClick={() => setDiscarding(true)}>
            Discard
          </Button>
        )}
      </div>
      {commit.isPending ? <CommitProgress progress={progress.data} /> : null}
      {blocked ? (
        <p id={reasonId} className="max-w-prose text-sm text-ink" data-testid="commit-blocked">
          <span className="font-semibold">Not ready to commit:</span> {blocked}
        </p>
      ) : null}
      {commit.isError ? <Alert title="Nothing was imported.">{commit.error.message}</Alert> : null}
      {discard.isError ? <Alert title="The upload was not discarded.">{discard.error.message}</Alert> : null}
    </div>
  );
}
