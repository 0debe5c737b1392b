import { Link, useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { roleCan } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { ButtonLink, linkClasses } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { projectKeys } from '@/features/projects/api/keys';
import { useTarget } from '@/features/targets/api/get-target';
import { TargetDetails } from '@/features/targets/components/target-details';
import { DeleteTarget } from '@/features/targets/components/delete-target';
import { useDerived } from '@/features/targets/api/get-derived';
import { useMeasurements } from '@/features/targets/api/get-measurements';
import { DerivedValues, ModelCaution } from '@/features/targets/components/derived-values';
import { TargetMeasurements } from '@/features/targets/components/target-measurements';
import type { ProjectPageNotice } from './project';

/** The target's derived values and the measurements behind them; they load after the sheet's head so it shows at once. */
function TargetReadings({
  projectId,
  targetId,
  canUpload,
  approvedOnly,
}: {
  projectId: number;
  targetId: number;
  canUpload: boolean;
  /** Readers (students, guests) read approved values; values still under review are counted, not shown. */
  approvedOnly: boolean;
}) {
  const derived = useDerived(projectId, targetId);
  const shown = derived.data ? (approvedOnly ? derived.data.filter((d) => d.status === 'approved') : derived.data) : undefined;
  const withheld = derived.data && approvedOnly ? derived.data.length - (shown?.length ?? 0) : 0;
  const measurements = useMeasurements(projectId, targetId);
  const uploadLink = canUpload ? (
    <Link className={linkClasses} to={paths.project.upload.getHref(projectId)}>
      Upload measurements
    </Link>
  ) : null;

  return (
    <>
      <Section title="Derived values" className="mt-10">
        <ModelCaution className="mb-4" />
        {derived.isPending || measurements.isPending ? <StatusLine>Loading the derived values…</StatusLine> : null}
        {derived.isError ? <QueryError what="The derived values" error={derived.error} onRetry={() => void derived.refetch()} /> : null}
        {withheld > 0 ? (
          <p className="mb-4 text-sm text-ink-soft" data-testid="derived-withheld">
            {withheld === 1 ? '1 derived value is' : `${withheld} derived values are`} awaiting the lead astronomer’s review and will show
            here once approved.
          </p>
        ) : null}
        {shown && measurements.data ? (
          shown.length > 0 ? (
            <DerivedValues derived={shown} measurements={measurements.data} />
          ) : (
            <EmptyState title={approvedOnly ? 'No approved values yet' : 'No derived values yet'} action={uploadLink}>
              {approvedOnly
                ? 'The lead astronomer has not approved a value for this target yet.'
                : 'Values are derived and proposed for review when measurements of this target are committed from an upload.'}
            </EmptyState>
          )
        ) : null}
      </Section>
      <Section title="Measurements" className="mt-10">
        {measurements.isPending ? <StatusLine>Loading the measurements…</StatusLine> : null}
        {measurements.isError ? (
          <QueryError what="The measurements" error={measurements.error} onRetry={() => void measurements.refetch()} />
        ) : null}
        {measurements.data ? (
          measurements.data.length > 0 ? (
            <TargetMeasurements projectId={projectId} measurements={measurements.data} />
          ) : (
            <EmptyState title="No measurements yet" action={uploadLink}>
              Measurements arrive through uploads, from the upload page or a pipeline.
            </EmptyState>
          )
        ) : null}
      </Section>
    </>
  );
}

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
      <TargetReadings
        projectId={projectId}
        targetId={targetId}
        canUpload={roleCan(project.data.myRole, 'upload')}
        approvedOnly={project.data.myRole === 'reader'}
      />
    </>
  );
}

export function TargetRoute() {
  const projectId = useNumericParam('projectId');
  const targetId = useNumericParam('targetId');
  if (projectId === null || targetId === null) return <NotFoundMessage />;
  return <TargetPage key={`${projectId}/${targetId}`} projectId={projectId} targetId={targetId} />;
}
