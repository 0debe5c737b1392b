import { useState } from 'react';
import type { RederiveResult } from '@shared/schemas/derived';
import { Button } from '@/components/ui/button';
import { formatCount } from '@/lib/format';
import { useRederive } from '../api/rederive';

function outcomeWords(result: RederiveResult, wholeProject: boolean): string {
  if (result.proposed === 0) {
    return wholeProject
      ? `Nothing changed in ${formatCount(result.targets, 'target')}: no new proposals.`
      : 'Nothing changed: no new proposals.';
  }
  return `${formatCount(result.proposed, 'new proposal')} across ${formatCount(result.targets, 'target')}.`;
}

/**
 * Re-runs the derivations of one target (given `targetId`) or of the whole
 * project, and says in a status line how many values it proposed. The
 * line stays in the page so a screen reader announces each outcome.
 */
export function RederiveButton({ projectId, targetId, className }: { projectId: number; targetId?: number; className?: string }) {
  const rederive = useRederive(projectId, targetId);
  const [outcome, setOutcome] = useState<{ kind: 'done' | 'error'; text: string } | null>(null);
  const wholeProject = targetId === undefined;

  return (
    <div className={className}>
      <Button
        variant="secondary"
        disabled={rederive.isPending}
        onClick={() => {
          setOutcome(null);
          rederive.mutate(undefined, {
            onSuccess: (result) => setOutcome({ kind: 'done', text: outcomeWords(result, wholeProject) }),
            onError: (error) => setOutcome({ kind: 'error', text: `Re-running failed. ${error.message}` }),
          });
        }}
      >
        {rederive.isPending ? 'Re-running…' : 'Re-run derivations'}
      </Button>
      <p role="status" className="mt-1 text-sm text-ink" data-testid="rederive-outcome">
        {outcome ? (
          <>
            <span className={outcome.kind === 'error' ? 'font-semibold text-alert' : 'font-semibold text-good'}>
              {outcome.kind === 'error' ? 'Error:' : 'Done:'}
            </span>{' '}
            {outcome.text}
          </>
        ) : null}
      </p>
    </div>
  );
}
