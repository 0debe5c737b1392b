import { useState } from 'react';
import type { Member } from '@shared/schemas/projects';
import { projectRoles, roleLabels, type ProjectRole } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { formatDate } from '@/lib/format';
import { useUpdateMember } from '../api/update-member';
import { useRemoveMember } from '../api/remove-member';

interface MemberRowProps {
  projectId: number;
  member: Member;
  canManage: boolean;
  isMe: boolean;
  onChanged: (member: Member) => void;
}

function RoleEditor({ projectId, member, isMe, onChanged }: Omit<MemberRowProps, 'canManage'>) {
  const [role, setRole] = useState<ProjectRole>(member.role);
  const updateMember = useUpdateMember(projectId);
  const changed = role !== member.role;
  const selectId = `member-role-${member.userId}`;

  return (
    <div className="flex flex-wrap items-center gap-2">
      <label htmlFor={selectId} className="sr-only">
        Role of {member.name}
      </label>
      <select
        id={selectId}
        value={role}
        onChange={(e) => {
          updateMember.reset();
          setRole(e.target.value as ProjectRole);
        }}
        className="rounded-sm border border-rule bg-paper px-2 py-1 text-sm"
      >
        {projectRoles.map((r) => (
          <option key={r} value={r}>
            {roleLabels[r]}
          </option>
        ))}
      </select>
      {changed ? (
        <>
          <Button
            size="sm"
            disabled={updateMember.isPending}
            onClick={() => updateMember.mutate({ userId: member.userId, role }, { onSuccess: (updated) => onChanged(updated) })}
          >
            {updateMember.isPending ? 'Saving…' : 'Save role'}
          </Button>
          {isMe && member.role === 'lead' ? (
            <span className="w-full text-xs text-ink-soft">You will no longer manage this project’s members and settings.</span>
          ) : null}
        </>
      ) : null}
      {updateMember.isSuccess && !changed ? (
        <span role="status" className="text-xs text-good">
          Saved
        </span>
      ) : null}
      {updateMember.isError ? (
        <span role="alert" className="w-full text-xs">
          <span className="font-semibold text-alert">Error:</span> {updateMember.error.message}
        </span>
      ) : null}
    </div>
  );
}

function RemoveMember({ projectId, member, isMe, onChanged }: Omit<MemberRowProps, 'canManage'>) {
  const [confirming, setConfirming] = useState(false);
  const removeMember = useRemoveMember(projectId);

  if (!confirming) {
    return (
      <Button size="sm" variant="danger" onClick={() => setConfirming(true)} aria-label={`Remove ${member.name}`}>
        Remove
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Confirm removal of ${member.name}`} className="flex flex-wrap items-center justify-end gap-2">
      <span className="text-xs">{isMe ? 'Remove yourself from this project?' : `Remove ${member.name} from this project?`}</span>
      <Button
        size="sm"
        variant="danger"
        disabled={removeMember.isPending}
        onClick={() => removeMember.mutate(member.userId, { onSuccess: () => onChanged(member) })}
      >
        {removeMember.isPending ? 'Removing…' : 'Yes, remove'}
      </Button>
      <Button size="sm" variant="secondary" disabled={removeMember.isPending} onClick={() => setConfirming(false)}>
        Keep
      </Button>
      {removeMember.isError ? (
        <span role="alert" className="w-full text-right text-xs">
          <span className="font-semibold text-alert">Error:</span> {removeMember.error.message}
        </span>
      ) : null}
    </div>
  );
}

/**
 * The people in a project and their roles. A lead astronomer can change roles
 * and remove people; everyone else sees the list only.
 */
export function MembersList({
  projectId,
  members,
  canManage,
  currentUserId,
  onChanged,
}: {
  projectId: number;
  members: Member[];
  canManage: boolean;
  currentUserId: number;
  onChanged: (member: Member) => void;
}) {
  return (
    <LedgerTable aria-label="Members">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">Name</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">E-mail</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Role</LedgerHeaderCell>
          <LedgerHeaderCell scope="col" numeric>
            Member since
          </LedgerHeaderCell>
          {canManage ? (
            <LedgerHeaderCell scope="col" numeric>
              <span className="sr-only">Actions</span>
            </LedgerHeaderCell>
          ) : null}
        </tr>
      </LedgerHead>
      <LedgerBody>
        {members.map((member) => {
          const isMe = member.userId === currentUserId;
          return (
            <LedgerRow key={member.userId}>
              <LedgerCell className="font-semibold">
                {member.name}
                {isMe ? <span className="ml-1 text-xs font-normal text-ink-soft">(you)</span> : null}
              </LedgerCell>
              <LedgerCell>{member.email}</LedgerCell>
              <LedgerCell>
                {canManage ? (
                  <RoleEditor projectId={projectId} member={member} isMe={isMe} onChanged={onChanged} />
                ) : (
                  roleLabels[member.role]
                )}
              </LedgerCell>
              <LedgerCell numeric>{formatDate(member.addedAt)}</LedgerCell>
              {canManage ? (
                <LedgerCell numeric>
                  <RemoveMember projectId={projectId} member={member} isMe={isMe} onChanged={onChanged} />
                </LedgerCell>
              ) : null}
            </LedgerRow>
          );
        })}
      </LedgerBody>
    </LedgerTable>
  );
}
