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
            ? 'The people in this project and their roles. As lead astronomer you add people, change roles and remove people.'
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
    </>
  );
}

export function MembersRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <MembersPage key={projectId} projectId={projectId} />;
}
