import { lazy, Suspense } from 'react';
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
import { useSpectra } from '@/features/targets/api/get-spectra';
import { DerivedValues, ModelCaution } from '@/features/targets/components/derived-values';
import { TargetMeasurements } from '@/features/targets/components/target-measurements';
import { TargetSpectra } from '@/features/targets/components/target-spectra';
import { CrossChecks, currentValues } from '@/features/targets/components/cross-checks';
import { RederiveButton } from '@/features/review/components/rederive-button';
import type { ProjectPageNotice } from './project';

// The chart code is fetched only by a sheet that has a star to draw.
const TargetHr = lazy(() => import('@/features/hr-diagram/components/target-hr'));

/** Space held for the small diagram and its caption, so the sheet does not shift when the chart code arrives. */
const TARGET_HR_SPACE = 'min-h-[23rem]';

/** The target's derived values, spectra and the measurements behind them; they load after the sheet's head so it shows at once. */
function TargetReadings({
  projectId,
  targetId,
  designation,
  canUpload,
  canRederive,
  canReadQueue,
  isReader,
  canSeeProposed,
}: {
  projectId: number;
  targetId: number;
  designation: string;
  canUpload: boolean;
  canRederive: boolean;
  /** Observers and the lead are pointed to this target's values in the review queue. */
  canReadQueue: boolean;
  /** Readers (students, guests) are sent approved values only, so an empty list may still hide values under review. */
  isReader: boolean;
  canSeeProposed: boolean;
}) {
  // Every revision: the sheet shows the approved value and any newer proposal at a glance, and each quantity's review history.
  const derived = useDerived(projectId, targetId, 'all');
  const awaiting = derived.data?.filter((d) => d.status === 'proposed').length ?? 0;
  const spectra = useSpectra(projectId, targetId);
  const measurements = useMeasurements(projectId, targetId);
  const current = derived.data ? currentValues(derived.data) : [];
  const onDiagram = current.some((v) => v.quantity === 'temperature') && current.some((v) => v.quantity === 'luminosity');
  // The sections come in together once all three lists are in: one arriving before another would push what is below it down the page.
  if (derived.isPending || measurements.isPending || spectra.isPending) {
    return (
      <Section title="Derived values" className="mt-10">
        <StatusLine>Loading the derived values, spectra and measurements…</StatusLine>
      </Section>
    );
  }
  const uploadLink = canUpload ? (
    <Link className={linkClasses} to={paths.project.upload.getHref(projectId)}>
      Upload measurements
    </Link>
  ) : null;

  return (
    <>
      <Section
        title="Derived values"
        className="mt-10"
        actions={canRederive ? <RederiveButton projectId={projectId} targetId={targetId} className="text-right" /> : null}
      >
        <ModelCaution className="mb-4" />
        {canReadQueue && awaiting > 0 ? (
          <p className="mb-4 text-sm text-ink" data-testid="awaiting-review">
            {awaiting === 1 ? '1 value awaits' : `${awaiting} values await`} the lead astronomer’s review.{' '}
            <Link className={linkClasses} to={paths.project.review.getHref(projectId, targetId)}>
              Open them in the review queue
            </Link>
          </p>
        ) : null}
        {derived.isError ? <QueryError what="The derived values" error={derived.error} onRetry={() => void derived.refetch()} /> : null}
        {derived.data && measurements.data ? (
          derived.data.length > 0 ? (
            <DerivedValues revisions={derived.data} measurements={measurements.data} />
          ) : isReader ? (
            <EmptyState title="No approved values yet">
              <p data-testid="derived-withheld">
                Values still under the lead astronomer’s review are not shown here yet; they appear once approved.
              </p>
            </EmptyState>
          ) : (
            <EmptyState title="No derived values yet" action={uploadLink}>
              Values are derived and proposed for review when measurements of this target are committed from an upload.
            </EmptyState>
          )
        ) : null}
      </Section>
      {derived.data && derived.data.length > 0 ? (
        <Section title="Cross-checks" className="mt-10">
          <CrossChecks revisions={derived.data} />
        </Section>
      ) : null}
      {onDiagram ? (
        <Section title="On the HR diagram" className="mt-10">
          <div className={TARGET_HR_SPACE}>
            <Suspense fallback={<StatusLine>Loading the diagram…</StatusLine>}>
              <TargetHr projectId={projectId} targetId={targetId} designation={designation} canSeeProposed={canSeeProposed} />
            </Suspense>
          </div>
        </Section>
      ) : null}
      {spectra.isError ? (
        <Section title="Spectra" className="mt-10">
          <QueryError what="The spectra" error={spectra.error} onRetry={() => void spectra.refetch()} />
        </Section>
      ) : null}
      {spectra.data && spectra.data.length > 0 ? (
        <Section title={spectra.data.length === 1 ? 'Spectrum' : 'Spectra'} className="mt-10">
          <TargetSpectra projectId={projectId} designation={designation} spectra={spectra.data} />
        </Section>
      ) : null}
      <Section title="Measurements" className="mt-10">
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
        designation={data.designation}
        canUpload={roleCan(project.data.myRole, 'upload')}
        canRederive={roleCan(project.data.myRole, 'rederive')}
        canReadQueue={roleCan(project.data.myRole, 'readQueue')}
        isReader={project.data.myRole === 'reader'}
        canSeeProposed={roleCan(project.data.myRole, 'readProposed')}
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
