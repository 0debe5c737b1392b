import { useEffect } from 'react';
import { useSearchParams } from 'react-router-dom';
import { roleCan } from '@shared/schemas/roles';
import type { TrailFilters } from '@shared/schemas/trail';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { Button, buttonClasses } from '@/components/ui/button';
import { Pager } from '@/components/ui/pager';
import { EmptyState } from '@/components/ui/empty-state';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { formatCount } from '@/lib/format';
import { PAGE_SIZES, readPageParams, writePageParams } from '@/lib/page-params';
import { useMembers } from '@/features/members/api/get-members';
import { useProject } from '@/features/projects/api/get-project';
import { useTargetChoices } from '@/features/targets/api/get-target-choices';
import { useTrail } from '@/features/trail/api/get-trail';
import { trailExportHref, type TrailListParams } from '@/features/trail/api/keys';
import { dateRangeError, TrailFiltersForm } from '@/features/trail/components/trail-filters';
import { TrailTable } from '@/features/trail/components/trail-table';

const DATE = /^\d{4}-\d{2}-\d{2}$/;

const positive = (v: string | null) => {
  const n = Number.parseInt(v ?? '', 10);
  return Number.isSafeInteger(n) && n > 0 ? n : undefined;
};

/*
 * The filters and the page live in the address bar (person, action, target,
 * from, to, page, pageSize), so a filtered trail can be bookmarked or sent,
 * and Back returns to it.
 */
function readParams(search: URLSearchParams): TrailListParams {
  const from = search.get('from') ?? '';
  const to = search.get('to') ?? '';
  return {
    ...readPageParams(search),
    actorId: positive(search.get('person')),
    action: search.get('action')?.trim() || undefined,
    targetId: positive(search.get('target')),
    from: DATE.test(from) ? from : undefined,
    to: DATE.test(to) ? to : undefined,
  };
}

function writeParams(p: TrailListParams): URLSearchParams {
  const search = new URLSearchParams();
  if (p.actorId) search.set('person', String(p.actorId));
  if (p.action) search.set('action', p.action);
  if (p.targetId) search.set('target', String(p.targetId));
  if (p.from) search.set('from', p.from);
  if (p.to) search.set('to', p.to);
  writePageParams(search, p);
  return search;
}

function TrailPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const canRead = roleCan(project.data?.myRole, 'readTrail');
  const [searchParams, setSearchParams] = useSearchParams();
  const params = readParams(searchParams);
  const filters: TrailFilters = { actorId: params.actorId, action: params.action, targetId: params.targetId, from: params.from, to: params.to };
  // A range whose end comes before its start is said at its field and not sent.
  const rangeProblem = dateRangeError(filters);
  const trail = useTrail(projectId, params, { enabled: canRead && !rangeProblem });
  const people = useMembers(projectId, { enabled: canRead });
  const targets = useTargetChoices(projectId, { enabled: canRead });

  // Built from the address as it is now, so two quick changes in a row both stick.
  const update = (next: Partial<TrailListParams>, { resetPage = true } = {}) =>
    setSearchParams((current) => writeParams({ ...readParams(current), ...(resetPage ? { page: 1 } : {}), ...next }), { replace: true });

  // A bookmarked page number can outlive the entries it pointed at (other filters, say); fall back to the last page there is.
  const lastPage = trail.data && trail.data.total > 0 ? Math.ceil(trail.data.total / trail.data.pageSize) : null;
  useEffect(() => {
    if (lastPage !== null && params.page > lastPage) {
      setSearchParams((current) => {
        const next = new URLSearchParams(current);
        next.set('page', String(lastPage));
        return next;
      }, { replace: true });
    }
  }, [lastPage, params.page, setSearchParams]);

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!canRead) {
    return (
      <ForbiddenMessage detail="The review trail is for the project’s observers, lead astronomer and PI: it records values the lead has not yet approved, which readers are not shown." />
    );
  }

  const { data } = project;
  const page = trail.data;
  const pageCount = page ? Math.max(1, Math.ceil(page.total / page.pageSize)) : 1;
  const filtered = Boolean(filters.actorId || filters.action || filters.targetId || filters.from || filters.to);
  const exportable = !rangeProblem && page !== undefined && page.total > 0;

  return (
    <>
      <title>{`Review trail · ${data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={data.code}
        title="Review trail"
        description="Every change to this project’s data and access: who, when (UTC), what, before and after, and the note. Entries are never edited or deleted."
        actions={
          <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Export the trail as shown">
            {(['csv', 'json'] as const).map((format) =>
              exportable ? (
                <a key={format} href={trailExportHref(projectId, filters, format)} download className={buttonClasses('secondary')}>
                  Export {format.toUpperCase()}
                  {filtered ? <span className="sr-only"> (filtered)</span> : null}
                </a>
              ) : (
                <Button key={format} variant="secondary" disabled>
                  Export {format.toUpperCase()}
                </Button>
              ),
            )}
          </div>
        }
      />
      <div className="space-y-4">
        <TrailFiltersForm filters={filters} people={people.data} targets={targets.data} onChange={(next) => update(next)} />
        {filtered ? <p className="text-xs text-ink-soft">The export buttons export the trail with these filters.</p> : null}
        {!rangeProblem && trail.isPending ? <StatusLine>Loading the trail…</StatusLine> : null}
        {trail.isError && !page ? <QueryError what="The trail" error={trail.error} onRetry={() => void trail.refetch()} inline /> : null}
        {!rangeProblem && page && page.total === 0 ? (
          <EmptyState title={filtered ? 'No entries match these filters' : 'Nothing recorded yet'}>
            {filtered ? 'Widen the date range or clear a filter.' : 'Uploads, targets, values and members appear here as they change.'}
          </EmptyState>
        ) : null}
        {!rangeProblem && page && page.total > 0 ? (
          <>
            <TrailTable projectId={projectId} entries={page.items} people={people.data} targets={targets.data} busy={trail.isPlaceholderData} />
            <Pager
              label="Pages of the trail"
              summary={
                <>
                  {formatCount(page.total, 'entry', 'entries')}
                  {filtered ? ' match' : ''} · page {page.page} of {pageCount}
                  {trail.isFetching ? ' · updating…' : ''}
                </>
              }
              page={params.page}
              pageCount={pageCount}
              onPage={(next) => update({ page: next }, { resetPage: false })}
              pageSize={params.pageSize}
              pageSizes={PAGE_SIZES}
              onPageSize={(size) => update({ pageSize: size })}
              pageSizeLabel="Entries per page"
              previousLabel="Newer"
              nextLabel="Older"
            />
          </>
        ) : null}
      </div>
    </>
  );
}

export function TrailRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <TrailPage key={projectId} projectId={projectId} />;
}
