import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { useUploads } from '@/features/uploads/api/get-uploads';
import { UploadsList } from '@/features/uploads/components/uploads-list';

function UploadsPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const uploads = useUploads(projectId);

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  const canUpload = roleCan(project.data.myRole, 'upload');
  const uploadButton = canUpload ? <ButtonLink to={paths.project.upload.getHref(projectId)}>Upload a file</ButtonLink> : null;

  return (
    <>
      <title>{`Uploads · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={project.data.code}
        title="Uploads"
        description="Every file this project received, kept byte for byte: who sent it, when, and whether it was imported. Download any file as it was sent."
        actions={uploadButton}
      />
      {uploads.isPending ? <StatusLine>Loading the uploads…</StatusLine> : null}
      {uploads.isError ? <QueryError what="The uploads" error={uploads.error} onRetry={() => void uploads.refetch()} /> : null}
      {uploads.data ? (
        uploads.data.length > 0 ? (
          <UploadsList projectId={projectId} uploads={uploads.data} />
        ) : (
          <EmptyState title="No uploads yet" action={uploadButton}>
            Measurement files and spectra sent from the upload page or by a pipeline appear here.
          </EmptyState>
        )
      ) : null}
    </>
  );
}

export function UploadsRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <UploadsPage key={projectId} projectId={projectId} />;
}
