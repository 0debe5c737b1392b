import { Link } from 'react-router-dom';
import type { CommitResult } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { Alert } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { formatCount } from '@/lib/format';

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

/** Links to the target sheets of the targets a committed upload touched, where their new values can be read. */
export function AffectedTargets({ projectId, targets }: { projectId: number; targets: CommitResult['targets'] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label="Targets in this upload" data-testid="upload-targets">
      {targets.map((target) => (
        <li key={target.id}>
          <Link className={linkClasses} to={paths.project.target.getHref(projectId, target.id)}>
            {target.designation}
          </Link>
        </li>
      ))}
    </ul>
  );
}
