import { useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { projectKeys } from '@/features/projects/api/keys';
import { CreateTargetForm } from '@/features/targets/components/target-form';

function NewTargetPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!roleCan(project.data.myRole, 'editTargets')) {
    return <ForbiddenMessage detail="Only observers and the lead astronomer add targets." />;
  }

  return (
    <>
      <title>{`New target · ${project.data.code} · Starledger`}</title>
      <PageHeader eyebrow={project.data.code} title="New target" description="Coordinates are J2000." />
      <CreateTargetForm
        projectId={projectId}
        cancelHref={paths.project.root.getHref(projectId)}
        onCreated={(target) => {
          // The project's target count changed.
          void queryClient.invalidateQueries({ queryKey: projectKeys.all });
          navigate(paths.project.target.getHref(projectId, target.id), { replace: true });
        }}
      />
    </>
  );
}

export function NewTargetRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <NewTargetPage key={projectId} projectId={projectId} />;
}
