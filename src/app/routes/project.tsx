import { useLocation } from 'react-router-dom';
import { roleCan, roleLabels } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { Alert, StatusLine } from '@/components/ui/alert';
import { ButtonLink } from '@/components/ui/button';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { ProjectSite } from '@/features/projects/components/project-site';
import { TargetsTable } from '@/features/targets/components/targets-table';
import { ValuesExport } from '@/features/projects/components/values-export';

/** A one-off message handed over by the page that sent the person here (such as "deleted"). */
export interface ProjectPageNotice {
  notice?: string;
}

function ProjectPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const location = useLocation();
  const notice = (location.state as ProjectPageNotice | null)?.notice;

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;

  const { data } = project;
  const canEdit = roleCan(data.myRole, 'editTargets');

  return (
    <>
      <title>{`${data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={data.code}
        title={data.name}
        description={
          <>
            <ProjectSite site={data.site} />
            {data.description ? <p className="mt-2 whitespace-pre-wrap">{data.description}</p> : null}
            {data.myRole ? <p className="mt-2">Your role: {roleLabels[data.myRole]}.</p> : null}
          </>
        }
        actions={
          canEdit ? (
            <ButtonLink to={paths.project.newTarget.getHref(projectId)}>Add target</ButtonLink>
          ) : null
        }
      />
      {notice ? <Alert kind="done" title={notice} className="mb-4" /> : null}
      <h2 className="sr-only">Targets</h2>
      <TargetsTable projectId={projectId} canEdit={canEdit} canReadQueue={roleCan(data.myRole, 'readQueue')}>
        {data.myRole ? <ValuesExport projectId={projectId} canSeeProposed={roleCan(data.myRole, 'readProposed')} /> : null}
      </TargetsTable>
    </>
  );
}

export function ProjectRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <ProjectPage key={projectId} projectId={projectId} />;
}
