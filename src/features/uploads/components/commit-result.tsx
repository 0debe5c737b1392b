import { Link } from 'react-router-dom';
import { designationKey } from '@shared/coordinates';
import type { Upload } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { Alert, StatusLine } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { formatCount } from '@/lib/format';
import type { CommitResult } from '../api/commit-upload';
import { useUploadTargetNames } from '../api/get-upload-rows';
import type { TargetChoice } from './upload-form';

/** What the commit just did, counted. */
export function CommitOutcome({ result }: { result: CommitResult }) {
  return (
    <Alert kind="done" title="Committed. The file was imported whole." className="mb-6">
      <ul className="list-disc space-y-0.5 pl-5" data-testid="commit-outcome">
        <li>{formatCount(result.measurementsAdded, 'measurement')} added.</li>
        <li>
          {result.targetsCreated.length === 0
            ? 'No new targets.'
            : `${formatCount(result.targetsCreated.length, 'target')} created: ${result.targetsCreated.join(', ')}.`}
        </li>
        <li>
          {formatCount(result.derivedProposed, 'derived value')} proposed; they wait for the lead astronomer’s review before they count as
          approved.
        </li>
      </ul>
    </Alert>
  );
}

function TargetLinks({ projectId, names, targets, truncated }: { projectId: number; names: string[]; targets: readonly TargetChoice[]; truncated: boolean }) {
  const byKey = new Map(targets.map((t) => [designationKey(t.designation), t]));
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Targets in this upload" data-testid="upload-targets">
      {names.map((name) => {
        const target = byKey.get(designationKey(name));
        return (
          <li key={name}>
            {target ? (
              <Link className={linkClasses} to={paths.project.target.getHref(projectId, target.id)}>
                {target.designation}
              </Link>
            ) : (
              <span>{name}</span>
            )}
          </li>
        );
      })}
      {truncated ? <li className="text-ink-soft italic">and others further down the file</li> : null}
    </ul>
  );
}

/** Links to the target sheets of the targets a committed upload touched, where their new values can be read. */
export function AffectedTargets({ projectId, upload, targets }: { projectId: number; upload: Upload; targets: readonly TargetChoice[] }) {
  const targetColumn =
    upload.kind === 'measurements' && upload.mapping
      ? (Object.entries(upload.mapping.columns).find(([, role]) => role.role === 'field' && role.field === 'target')?.[0] ?? null)
      : null;
  const names = useUploadTargetNames(projectId, upload.id, targetColumn);

  if (upload.kind === 'spectrum') {
    const target = targets.find((t) => t.id === upload.spectrum?.targetId);
    return target ? <TargetLinks projectId={projectId} names={[target.designation]} targets={targets} truncated={false} /> : null;
  }
  if (targetColumn === null) return null;
  if (names.isPending) return <StatusLine>Finding the targets in the file…</StatusLine>;
  if (names.isError) return <p className="text-sm text-alert">The list of targets could not be read: {names.error.message}</p>;
  return <TargetLinks projectId={projectId} names={names.data.names} targets={targets} truncated={names.data.truncated} />;
}
