import type { Invitation } from '@shared/schemas/invitations';
import { roleLabels } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { formatDateTime } from '@/lib/format';
import { useRevokeInvitation } from '../api/revoke-invitation';

function Withdraw({ projectId, invitation }: { projectId: number; invitation: Invitation }) {
  const revoke = useRevokeInvitation(projectId);
  return (
    <div className="flex flex-wrap items-center justify-end gap-2">
      <Button size="sm" variant="danger" disabled={revoke.isPending} onClick={() => revoke.mutate(invitation.id)} aria-label={`Withdraw the invitation for ${invitation.email}`}>
        {revoke.isPending ? 'Withdrawing…' : 'Withdraw'}
      </Button>
      {revoke.isError ? (
        <span role="alert" className="w-full text-right text-xs">
          <span className="font-semibold text-alert">Error:</span> {revoke.error.message}
        </span>
      ) : null}
    </div>
  );
}

/** Invitations sent and not yet answered; withdrawing one makes its link refuse. */
export function PendingInvitations({ projectId, invitations }: { projectId: number; invitations: Invitation[] }) {
  if (invitations.length === 0) return <p className="text-sm text-ink-soft">No invitation is waiting for an answer.</p>;
  return (
    <LedgerTable aria-label="Invitations waiting for an answer">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">E-mail</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Role</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Invited by</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Works until
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            <span className="sr-only">Actions</span>
          </LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {invitations.map((inv) => (
          <LedgerRow key={inv.id}>
            <LedgerCell className="font-semibold">{inv.email}</LedgerCell>
            <LedgerCell>{roleLabels[inv.role]}</LedgerCell>
            <LedgerCell>{inv.invitedByName ?? '—'}</LedgerCell>
            <LedgerCell numeric>{formatDateTime(inv.expiresAt)}</LedgerCell>
            <LedgerCell numeric>
              <Withdraw projectId={projectId} invitation={inv} />
            </LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
