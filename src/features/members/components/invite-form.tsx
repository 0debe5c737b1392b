import { roleLabels } from '@shared/schemas/roles';
import { formatDateTime } from '@/lib/format';
import { useCreateInvitation } from '../api/create-invitation';
import { EmailRoleForm } from './email-role-form';

/** A lead astronomer invites an address by e-mail; the person chooses a password when accepting, or signs in if they have an account. */
export function InviteForm({ projectId }: { projectId: number }) {
  const invite = useCreateInvitation(projectId);
  return (
    <EmailRoleForm
      name="Invite by e-mail"
      hint="We send a link that works once, for 7 days."
      submitLabel="Send invitation"
      pendingLabel="Sending…"
      failedTitle="No invitation was sent."
      send={async (body) => {
        const invitation = await invite.mutateAsync(body);
        return `Invitation for ${invitation.email} as ${roleLabels[invitation.role]} sent; it works until ${formatDateTime(invitation.expiresAt)}.`;
      }}
    />
  );
}
