import { Button } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { useAcceptInvitation } from '../api/accept-invitation';

/** Accepting for an account that exists, once its owner is signed in: one press adds the project. */
export function JoinAsMember({ token, onAccepted }: { token: string; onAccepted: (projectId: number) => void }) {
  const accept = useAcceptInvitation();
  return (
    <div className="space-y-4">
      {accept.isError ? <Alert title="The invitation was not accepted.">{accept.error.message}</Alert> : null}
      <Button className="w-full" disabled={accept.isPending} onClick={() => accept.mutate({ token }, { onSuccess: (a) => onAccepted(a.projectId) })}>
        {accept.isPending ? 'Joining…' : 'Accept and join the project'}
      </Button>
    </div>
  );
}
