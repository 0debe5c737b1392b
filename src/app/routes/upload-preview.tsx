import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import type { CommitResult, Upload } from '@shared/schemas/uploads';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader, Section } from '@/components/ui/page-header';
import { Alert, StatusLine } from '@/components/ui/alert';
import { ButtonLink } from '@/components/ui/button';
import { SpectrumChart } from '@/components/charts/spectrum-chart';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { projectKeys } from '@/features/projects/api/keys';
import { useTargetChoices } from '@/features/targets/api/get-target-choices';
import { targetKeys } from '@/features/targets/api/keys';
import { useUpload } from '@/features/uploads/api/get-upload';
import { useUploadRows } from '@/features/uploads/api/get-upload-rows';
import { useRemapUpload } from '@/features/uploads/api/remap-upload';
import { ColumnMappingForm } from '@/features/uploads/components/column-mapping';
import { CommitPanel } from '@/features/uploads/components/commit-panel';
import { AffectedTargets, CommitOutcome } from '@/features/uploads/components/commit-result';
import { PreviewTable } from '@/features/uploads/components/preview-table';
import { SunCautions, UploadSummary } from '@/features/uploads/components/upload-summary';
import { UPLOAD_STATUS_WORDS } from '@/features/uploads/components/upload-words';

/** Problems with the file as a whole (its header, or a spectrum that could not be fitted), when no mapping form shows them. */
function FileProblems({ upload }: { upload: Upload }) {
  const problems = upload.errors.filter((e) => e.row === 1);
  if (problems.length === 0) return null;
  return (
    <Alert title="The file as a whole has problems." className="mb-6">
      <ul className="list-disc pl-5">
        {problems.map((e, i) => (
          <li key={i}>
            {e.column ? <span className="font-semibold">{e.column}: </span> : null}
            {e.message}
          </li>
        ))}
      </ul>
    </Alert>
  );
}

function UploadPreviewPage({ projectId, uploadId }: { projectId: number; uploadId: number }) {
  const project = useProject(projectId);
  const upload = useUpload(projectId, uploadId);
  const targets = useTargetChoices(projectId);
  // Same key as the preview table's first page, so the mapping's sample row costs no extra request.
  const firstPage = useUploadRows(projectId, uploadId, { page: 1, pageSize: 50, onlyErrors: false });
  const remap = useRemapUpload(projectId, uploadId);
  const queryClient = useQueryClient();
  const [result, setResult] = useState<CommitResult | null>(null);

  if (project.isPending || upload.isPending) return <StatusLine>Loading the upload…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (upload.isError) return <QueryError what="The upload" error={upload.error} onRetry={() => void upload.refetch()} />;

  const canUpload = roleCan(project.data.myRole, 'upload');
  const u = upload.data;
  const previewed = u.status === 'previewed';
  const spectrumTarget = u.spectrum ? (targets.data?.find((t) => t.id === u.spectrum?.targetId)?.designation ?? null) : null;
  const touched = result?.targets ?? (u.status === 'committed' ? u.targets : null);
  const sample = firstPage.data?.rows[0]?.cells ?? null;
  const onDataChanged = () => {
    void queryClient.invalidateQueries({ queryKey: targetKeys.project(projectId) });
    void queryClient.invalidateQueries({ queryKey: projectKeys.detail(projectId) });
  };

  return (
    <>
      <title>{`Upload ${u.id} · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={`${project.data.code} · upload ${u.id}`}
        title={u.filename}
        description={
          <p>
            {u.kind === 'spectrum' ? `Spectrum${spectrumTarget ? ` of ${spectrumTarget}` : ''}` : 'Measurements'} ·{' '}
            <span className="font-semibold text-ink">{UPLOAD_STATUS_WORDS[u.status]}</span>
            {previewed ? ' — nothing from this file is in the project until it is committed.' : null}
          </p>
        }
        actions={
          <>
            <ButtonLink to={paths.project.uploads.getHref(projectId)} variant="secondary">
              Upload history
            </ButtonLink>
            {canUpload && !previewed ? <ButtonLink to={paths.project.upload.getHref(projectId)}>Upload another file</ButtonLink> : null}
          </>
        }
      />

      <SunCautions upload={u} />
      {result ? <CommitOutcome result={result} /> : null}
      {u.status === 'discarded' ? <Alert kind="notice" title="This upload was discarded; nothing from it was imported." className="mb-6" /> : null}

      {touched ? (
        <Section title="Targets in this upload" className="mb-10">
          <p className="mb-2 text-sm text-ink-soft">Their sheets show the new measurements and the derived values proposed from them.</p>
          <AffectedTargets projectId={projectId} targets={touched} />
        </Section>
      ) : null}

      <Section title="Summary" className="mb-10">
        <UploadSummary projectId={projectId} upload={u} />
      </Section>

      {u.kind === 'spectrum' && u.spectrum ? (
        <Section title="Spectrum and Planck fit" className="mb-10">
          <SpectrumChart points={u.spectrum.points} pointCount={u.spectrum.pointCount} fit={u.spectrum.fit} designation={spectrumTarget}>
            {u.spectrum.fit ? null : <Alert title="No Planck fit could be made.">The errors below say what stopped it.</Alert>}
          </SpectrumChart>
        </Section>
      ) : null}

      {u.kind === 'measurements' && previewed ? (
        <Section title="Column mapping" className="mb-10">
          <ColumnMappingForm
            key={JSON.stringify([u.headers, u.mapping, u.errors.filter((e) => e.row === 1)])}
            upload={u}
            sample={sample}
            canEdit={canUpload}
            pending={remap.isPending}
            error={remap.isError ? remap.error.message : null}
            onApply={(mapping) => remap.mutate(mapping)}
          />
        </Section>
      ) : (
        <FileProblems upload={u} />
      )}

      {u.kind === 'spectrum' ? (
        // A spectrum's hundreds of plain number pairs matter only when one of them is wrong.
        <Section title="The file as sent" className="mb-10">
          <details open={u.errors.some((e) => e.row > 1)}>
            <summary className="cursor-pointer text-sm text-brass underline-offset-4 hover:underline">
              {u.errors.some((e) => e.row > 1) ? 'Rows with their errors' : `Show the ${u.rowCount} rows as sent`}
            </summary>
            <div className="mt-3">
              <PreviewTable projectId={projectId} uploadId={u.id} errorCount={u.errorCount} />
            </div>
          </details>
        </Section>
      ) : (
        <Section title="Every row as sent" className="mb-10">
          <PreviewTable projectId={projectId} uploadId={u.id} errorCount={u.errorCount} />
        </Section>
      )}

      {previewed ? (
        <Section title="Commit or discard">
          {canUpload ? (
            <CommitPanel
              projectId={projectId}
              upload={u}
              onDataChanged={onDataChanged}
              onCommitted={(r) => {
                setResult(r);
                window.scrollTo({ top: 0 });
              }}
              onDiscarded={() => window.scrollTo({ top: 0 })}
            />
          ) : (
            <p className="text-sm text-ink-soft">The project’s observers and lead astronomer commit or discard uploads.</p>
          )}
        </Section>
      ) : null}
    </>
  );
}

export function UploadPreviewRoute() {
  const projectId = useNumericParam('projectId');
  const uploadId = useNumericParam('uploadId');
  if (projectId === null || uploadId === null) return <NotFoundMessage />;
  return <UploadPreviewPage key={`${projectId}/${uploadId}`} projectId={projectId} uploadId={uploadId} />;
}
