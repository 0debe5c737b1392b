import { useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ButtonLink } from '@/components/ui/button';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { projectKeys } from '@/features/projects/api/keys';
import { useTarget } from '@/features/targets/api/get-target';
import { TargetDetails } from '@/features/targets/components/target-details';
import { DeleteTarget } from '@/features/targets/components/delete-target';
import type { ProjectPageNotice } from './project';

function TargetPage({ projectId, targetId }: { projectId: number; targetId: number }) {
  const project = useProject(projectId);
  const target = useTarget(projectId, targetId);
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  if (project.isPending || target.isPending) return <StatusLine>Loading the target…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (target.isError) return <QueryError what="The target" error={target.error} onRetry={() => void target.refetch()} />;

  const canEdit = roleCan(project.data.myRole, 'editTargets');
  const { data } = target;

  return (
    <>
      <title>{`${data.designation} · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={`${project.data.code} · target`}
        title={data.designation}
        actions={
          canEdit ? (
            <>
              <ButtonLink to={paths.project.editTarget.getHref(projectId, targetId)} variant="secondary">
                Edit target
              </ButtonLink>
              <DeleteTarget
                projectId={projectId}
                target={data}
                onDeleted={() => {
                  void queryClient.invalidateQueries({ queryKey: projectKeys.all });
                  navigate(paths.project.root.getHref(projectId), {
                    replace: true,
                    state: { notice: `${data.designation} was deleted.` } satisfies ProjectPageNotice,
                  });
                }}
              />
            </>
          ) : null
        }
      />
      <TargetDetails target={data} />
    </>
  );
}

export function TargetRoute() {
  const projectId = useNumericParam('projectId');
  const targetId = useNumericParam('targetId');
  if (projectId === null || targetId === null) return <NotFoundMessage />;
  return <TargetPage key={`${projectId}/${targetId}`} projectId={projectId} targetId={targetId} />;
}
