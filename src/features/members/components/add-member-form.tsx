import type { Member } from '@shared/schemas/projects';
import { roleLabels } from '@shared/schemas/roles';
import { useAddMember } from '../api/add-member';
import { EmailRoleForm } from './email-role-form';

/** A lead astronomer adds someone who already has a Starledger account. */
export function AddMemberForm({ projectId, onAdded }: { projectId: number; onAdded?: (member: Member) => void }) {
  const addMember = useAddMember(projectId);
  return (
    <EmailRoleForm
      name="Add member"
      hint="For someone who already has a Starledger account. Anyone else: send an invitation below."
      submitLabel="Add member"
      pendingLabel="Adding…"
      failedTitle="Nobody was added."
      send={async (body) => {
        const member = await addMember.mutateAsync(body);
        onAdded?.(member);
        return `${member.name} added as ${roleLabels[member.role]}.`;
      }}
    />
  );
}
