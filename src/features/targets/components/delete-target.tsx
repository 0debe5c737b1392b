import { useState } from 'react';
import type { Target } from '@shared/schemas/targets';
import { Button } from '@/components/ui/button';
import { useDeleteTarget } from '../api/delete-target';

/** Deleting asks once more, in place, and says what will go. */
export function DeleteTarget({ projectId, target, onDeleted }: { projectId: number; target: Target; onDeleted: () => void }) {
  const [confirming, setConfirming] = useState(false);
  const deleteTarget = useDeleteTarget(projectId, target.id);

  if (!confirming) {
    return (
      <Button variant="danger" onClick={() => setConfirming(true)}>
        Delete target
      </Button>
    );
  }

  return (
    <div role="group" aria-label="Confirm deletion" className="flex flex-wrap items-center gap-3 rounded-sm border border-alert bg-paper-deep px-3 py-2 text-sm">
      <p>
        Delete <strong>{target.designation}</strong> from this project? The review trail keeps a record of it.
      </p>
      <Button variant="danger" disabled={deleteTarget.isPending} onClick={() => deleteTarget.mutate(undefined, { onSuccess: onDeleted })}>
        {deleteTarget.isPending ? 'Deleting…' : `Yes, delete ${target.designation}`}
      </Button>
      <Button variant="secondary" onClick={() => setConfirming(false)} disabled={deleteTarget.isPending}>
        Keep it
      </Button>
      {deleteTarget.isError ? (
        <p role="alert" className="w-full">
          <span className="font-semibold text-alert">Error:</span> {deleteTarget.error.message}
        </p>
      ) : null}
    </div>
  );
}
