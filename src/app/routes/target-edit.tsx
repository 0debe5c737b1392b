import { useNavigate } from 'react-router-dom';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { useTarget } from '@/features/targets/api/get-target';
import { EditTargetForm } from '@/features/targets/components/target-form';

function EditTargetPage({ projectId, targetId }: { projectId: number; targetId: number }) {
  const project = useProject(projectId);
  const target = useTarget(projectId, targetId);
  const navigate = useNavigate();

  if (project.isPending || target.isPending) return <StatusLine>Loading the target…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (target.isError) return <QueryError what="The target" error={target.error} onRetry={() => void target.refetch()} />;
  if (!roleCan(project.data.myRole, 'editTargets')) {
    return <ForbiddenMessage detail="Only observers and the lead astronomer edit targets." />;
  }

  const targetHref = paths.project.target.getHref(projectId, targetId);
  return (
    <>
      <title>{`Edit ${target.data.designation} · ${project.data.code} · Starledger`}</title>
      <PageHeader eyebrow={`${project.data.code} · target`} title={`Edit ${target.data.designation}`} description="Coordinates are J2000." />
      <EditTargetForm
        projectId={projectId}
        target={target.data}
        cancelHref={targetHref}
        onSaved={() => navigate(targetHref, { replace: true })}
      />
    </>
  );
}

export function EditTargetRoute() {
  const projectId = useNumericParam('projectId');
  const targetId = useNumericParam('targetId');
  if (projectId === null || targetId === null) return <NotFoundMessage />;
  return <EditTargetPage key={`${projectId}/${targetId}`} projectId={projectId} targetId={targetId} />;
}
