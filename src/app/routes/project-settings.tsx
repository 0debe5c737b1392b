import { useQueryClient } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { ProjectSettingsForm } from '@/features/projects/components/project-settings-form';
import { targetKeys } from '@/features/targets/api/keys';

function ProjectSettingsPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const queryClient = useQueryClient();

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!roleCan(project.data.myRole, 'manageSettings')) {
    return <ForbiddenMessage detail="Only the project’s lead astronomer changes its settings." />;
  }

  return (
    <>
      <title>{`Settings · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={project.data.code}
        title="Project settings"
        description="The programme’s name, description and observing site, and the extinction law its photometry is dereddened with."
      />
      <ProjectSettingsForm
        project={project.data}
        onSaved={(_, rederived) => {
          // A new R_V re-derives every target, so the table and the sheets show new proposals.
          if (rederived) void queryClient.invalidateQueries({ queryKey: targetKeys.project(projectId) });
        }}
      />
    </>
  );
}

export function ProjectSettingsRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <ProjectSettingsPage key={projectId} projectId={projectId} />;
}
