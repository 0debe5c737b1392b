import { useQueryClient } from '@tanstack/react-query';
import type { Member } from '@shared/schemas/projects';
import { roleCan } from '@shared/schemas/roles';
import { authKeys, useUser } from '@/lib/auth';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { projectKeys } from '@/features/projects/api/keys';
import { useMembers } from '@/features/members/api/get-members';
import { MembersList } from '@/features/members/components/members-list';
import { AddMemberForm } from '@/features/members/components/add-member-form';
import { InviteForm } from '@/features/members/components/invite-form';
import { PendingInvitations } from '@/features/members/components/pending-invitations';
import { useInvitations } from '@/features/members/api/get-invitations';

/** The lead's side of invitations: who is invited and not yet in, and a form to invite someone. */
function Invitations({ projectId }: { projectId: number }) {
  const invitations = useInvitations(projectId);
  return (
    <Section title="Invitations" className="mt-10">
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        An invitation goes by e-mail with a link that works once, for 7 days. Someone new chooses a name and a password; someone with an account signs in and the project joins their list.
      </p>
      {invitations.isPending ? <StatusLine>Loading invitations…</StatusLine> : null}
      {invitations.isError ? <QueryError what="The invitations" error={invitations.error} onRetry={() => void invitations.refetch()} inline /> : null}
      {invitations.data ? <PendingInvitations projectId={projectId} invitations={invitations.data} /> : null}
      <div className="mt-6">
        <InviteForm projectId={projectId} />
      </div>
    </Section>
  );
}

function MembersPage({ projectId }: { projectId: number }) {
  const user = useUser();
  const project = useProject(projectId);
  const members = useMembers(projectId);
  const queryClient = useQueryClient();

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;

  const canManage = roleCan(project.data.myRole, 'manageMembers');

  // A change to one's own membership changes what this person may see and do.
  const onChanged = (member: Member) => {
    if (member.userId !== user.id) return;
    void queryClient.invalidateQueries({ queryKey: projectKeys.all });
    void queryClient.invalidateQueries({ queryKey: authKeys.me() });
  };

  return (
    <>
      <title>{`Members · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={project.data.code}
        title="Members"
        description={
          canManage
            ? 'The people in this project and their roles. As lead astronomer you add and invite people, change roles and remove people.'
            : 'The people in this project and their roles. The lead astronomer manages membership.'
        }
      />
      {members.isPending ? <StatusLine>Loading members…</StatusLine> : null}
      {members.isError ? <QueryError what="The members" error={members.error} onRetry={() => void members.refetch()} /> : null}
      {members.data ? (
        <MembersList projectId={projectId} members={members.data} canManage={canManage} currentUserId={user.id} onChanged={onChanged} />
      ) : null}
      {canManage ? (
        <Section title="Add a member" className="mt-10">
          <AddMemberForm projectId={projectId} />
        </Section>
      ) : null}
      {canManage ? <Invitations projectId={projectId} /> : null}
    </>
  );
}

export function MembersRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <MembersPage key={projectId} projectId={projectId} />;
}
