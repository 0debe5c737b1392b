import { useNavigate } from 'react-router-dom';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ButtonLink } from '@/components/ui/button';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { useTargetChoices } from '@/features/targets/api/get-target-choices';
import { UploadForm } from '@/features/uploads/components/upload-form';
import { FileGuide } from '@/features/uploads/components/file-guide';

function UploadPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const canUpload = project.data ? roleCan(project.data.myRole, 'upload') : false;
  const targets = useTargetChoices(projectId, { enabled: canUpload });
  const navigate = useNavigate();

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!canUpload) return <ForbiddenMessage detail="Uploading measurements is for the project’s observers and lead astronomer." />;

  return (
    <>
      <title>{`Upload · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={project.data.code}
        title="Upload measurements"
        description="Send a night’s measurements or one target’s spectrum. You will see every row with its errors, and the column mapping, before anything is imported; a file is imported whole or not at all."
        actions={
          <ButtonLink to={paths.project.uploads.getHref(projectId)} variant="secondary">
            Upload history
          </ButtonLink>
        }
      />
      <div className="grid gap-10 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <UploadForm
          projectId={projectId}
          targets={targets.data ?? []}
          targetsLoading={targets.isPending}
          onUploaded={(upload) => navigate(paths.project.uploadPreview.getHref(projectId, upload.id))}
        />
        <Section title="Templates and columns">
          <FileGuide projectId={projectId} />
        </Section>
      </div>
      {targets.isError ? (
        <div className="mt-6">
          <QueryError what="The list of targets" error={targets.error} onRetry={() => void targets.refetch()} />
        </div>
      ) : null}
    </>
  );
}

export function UploadRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <UploadPage key={projectId} projectId={projectId} />;
}
