import { useEffect, useEffectEvent, useMemo, useState, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
  type Updater,
} from '@tanstack/react-table';
import { formatDeclination, formatRightAscension } from '@shared/coordinates';
import { targetSortKeys, type TableQuantity, type TableValue, type TargetRow } from '@shared/schemas/targets';
import { paths } from '@/config/paths';
import { Button, linkClasses } from '@/components/ui/button';
import { CheckboxField, TextField } from '@/components/ui/field';
import { Pager } from '@/components/ui/pager';
import { StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { EmptyState } from '@/components/ui/empty-state';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { DERIVED_STATUS_WORDS, derivedValueTexts } from '@/lib/derived-words';
import { PAGE_SIZES, readPageParams, writePageParams } from '@/lib/page-params';
import { formatCount, formatDateTime } from '@/lib/format';
import { useTargets } from '../api/get-targets';
import type { TargetListParams } from '../api/keys';

type SortKey = (typeof targetSortKeys)[number];

/*
 * The table's state lives in the address bar, so a filtered, sorted page can
 * be bookmarked or sent to a colleague, and Back returns to it.
 */
function readParams(search: URLSearchParams): TargetListParams {
  const sort = search.get('sort');
  const order = search.get('order');
  return {
    ...readPageParams(search),
    sort: (targetSortKeys as readonly string[]).includes(sort ?? '') ? (sort as SortKey) : 'designation',
    order: order === 'desc' ? 'desc' : 'asc',
    q: search.get('q')?.trim() || undefined,
    tag: search.get('tag')?.trim() || undefined,
    awaiting: search.get('awaiting') === 'true' ? true : undefined,
  };
}

function writeParams(params: TargetListParams): URLSearchParams {
  const search = new URLSearchParams();
  writePageParams(search, params);
  if (params.sort !== 'designation') search.set('sort', params.sort);
  if (params.order !== 'asc') search.set('order', params.order);
  if (params.q) search.set('q', params.q);
  if (params.tag) search.set('tag', params.tag);
  if (params.awaiting) search.set('awaiting', 'true');
  return search;
}

function resolve<T>(updater: Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

const column = createColumnHelper<TargetRow>();

/** Actions the cells call, passed through the table so the column definitions stay stable between renders. */
interface TableActions {
  filterByTag: (tag: string) => void;
}

const sortLabels: Record<SortKey, string> = {
  designation: 'designation',
  raDeg: 'right ascension',
  decDeg: 'declination',
  updatedAt: 'last update',
  temperature: 'effective temperature',
  spectral_class: 'spectral class',
  luminosity: 'luminosity',
  radius: 'radius',
  distance: 'distance',
};

/** Where the distance column's value came from, since it holds either route's result. */
const distanceRoutes: Record<string, string> = { distance_parallax: 'parallax', distance_photometric: 'photometric' };

/**
 * One adopted value as a ledger entry: value ± σ in the unit astronomers
 * read (the same conversion as the target sheet), and under it in small
 * type the route for a distance and the status as a word. Two lines rather
 * than one keep five value columns within a laptop's width.
 */
function ValueCell({ value }: { value: TableValue | undefined }) {
  if (!value) {
    return (
      <>
        <span className="text-ink-soft" aria-hidden="true">
          —
        </span>
        <span className="sr-only">no value</span>
      </>
    );
  }
  const [text] = derivedValueTexts(value);
  const route = distanceRoutes[value.quantity];
  return (
    <>
      <span className="block tabular-nums">{text}</span>
      <span className="block text-[0.7rem] leading-tight text-ink-soft">
        {route ? `${route} · ` : ''}
        <span className="font-semibold tracking-wide uppercase">{DERIVED_STATUS_WORDS[value.status]}</span>
      </span>
    </>
  );
}

const valueColumns: { quantity: TableQuantity; header: ReactNode }[] = [
  {
    quantity: 'temperature',
    header: (
      <>
        T<sub>eff</sub>
      </>
    ),
  },
  { quantity: 'spectral_class', header: 'Spectral class' },
  { quantity: 'luminosity', header: 'Luminosity (L☉)' },
  { quantity: 'radius', header: 'Radius (R☉)' },
  { quantity: 'distance', header: 'Distance (pc)' },
];

/**
 * A project's targets with their adopted values, paged, sorted and filtered
 * on the server. The server decides which revision each role sees (readers:
 * approved values only); roles that read the review queue also get the
 * "awaiting review" filter and, per target, a link to its proposals.
 */
export function TargetsTable({
  projectId,
  canEdit,
  canReadQueue,
  children,
}: {
  projectId: number;
  canEdit: boolean;
  canReadQueue: boolean;
  /** What follows the table on the page: shown once the first page of targets is in, so the table's arrival does not push it down. */
  children?: ReactNode;
}) {
  const [searchParams, setSearchParams] = useSearchParams();
  const params = readParams(searchParams);
  const update = (next: Partial<TargetListParams>, { resetPage = true } = {}) =>
    setSearchParams(writeParams({ ...params, ...(resetPage ? { page: 1 } : {}), ...next }), { replace: true });

  // The text boxes answer at once; the server is asked after a short pause in typing.
  const [qDraft, setQDraft] = useState(params.q ?? '');
  const [tagDraft, setTagDraft] = useState(params.tag ?? '');
  const q = useDebouncedValue(qDraft.trim());
  const tag = useDebouncedValue(tagDraft.trim());
  const applyTypedFilters = useEffectEvent((nextQ: string, nextTag: string) => {
    if ((params.q ?? '') !== nextQ || (params.tag ?? '') !== nextTag) update({ q: nextQ || undefined, tag: nextTag || undefined });
  });
  // Only a settled change of the typed text writes the address bar.
  useEffect(() => applyTypedFilters(q, tag), [q, tag]);
  // Follow the address bar when it changes from elsewhere (a tag clicked in a row, Back).
  useEffect(() => setQDraft(params.q ?? ''), [params.q]);
  useEffect(() => setTagDraft(params.tag ?? ''), [params.tag]);

  const query = useTargets(projectId, params);
  const data = query.data;
  const pageCount = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;

  // A bookmarked page number can outlive the rows it pointed at; fall back to the last page there is.
  const clampPage = useEffectEvent((lastPage: number) => update({ page: lastPage }, { resetPage: false }));
  useEffect(() => {
    if (data && data.total > 0 && data.page > pageCount) clampPage(pageCount);
  }, [data, pageCount]);

  const columns = useMemo(
    () => [
      column.accessor('designation', {
        header: 'Designation',
        cell: (info) => {
          const awaiting = info.row.original.awaitingReview;
          return (
            <>
              <Link to={paths.project.target.getHref(projectId, info.row.original.id)} className={`${linkClasses} inline-block min-h-6 py-0.5 font-semibold whitespace-nowrap`}>
                {info.getValue()}
              </Link>
              {canReadQueue && awaiting > 0 ? (
                <Link
                  to={paths.project.review.getHref(projectId, info.row.original.id)}
                  className={`${linkClasses} block min-h-6 py-1 text-xs whitespace-nowrap`}
                >
                  {awaiting} awaiting review<span className="sr-only"> for {info.getValue()}</span>
                </Link>
              ) : null}
            </>
          );
        },
      }),
      ...valueColumns.map(({ quantity, header }) =>
        // An accessor (not a display column) so the table offers the sort; the server does the sorting.
        column.accessor((row) => row.values[quantity]?.value, {
          id: quantity,
          header: () => header,
          cell: (info) => <ValueCell value={info.row.original.values[quantity]} />,
          meta: { numeric: true },
        }),
      ),
      column.accessor('raDeg', {
        header: 'RA (J2000, h m s)',
        cell: (info) => formatRightAscension(info.getValue()),
        meta: { numeric: true },
      }),
      column.accessor('decDeg', {
        header: 'Dec (J2000, ° ′ ″)',
        cell: (info) => formatDeclination(info.getValue()),
        meta: { numeric: true },
      }),
      column.accessor('tags', {
        header: 'Tags',
        enableSorting: false,
        cell: (info) => (
          <ul className="flex flex-wrap gap-1.5" aria-label={`Tags of ${info.row.original.designation}`}>
            {info.getValue().map((t) => (
              <li key={t}>
                <button
                  type="button"
                  onClick={() => (info.table.options.meta as TableActions).filterByTag(t)}
                  className="rounded-sm border border-rule px-1.5 py-0.5 text-xs whitespace-nowrap text-ink-soft hover:border-brass hover:text-ink"
                  aria-label={`Show only targets tagged ${t}`}
                >
                  {t}
                </button>
              </li>
            ))}
          </ul>
        ),
      }),
      column.accessor('updatedAt', {
        header: 'Updated (UTC)',
        cell: (info) => formatDateTime(info.getValue()).replace(' UTC', ''),
        meta: { numeric: true },
      }),
    ],
    [projectId, canReadQueue],
  );

  const sorting: SortingState = [{ id: params.sort, desc: params.order === 'desc' }];
  const pagination: PaginationState = { pageIndex: params.page - 1, pageSize: params.pageSize };

  const table = useReactTable({
    data: data?.items ?? [],
    columns,
    getRowId: (row) => String(row.id),
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    // Every column starts ascending on first click, numbers included, as a ledger is read.
    sortDescFirst: false,
    rowCount: data?.total ?? 0,
    state: { sorting, pagination },
    meta: { filterByTag: (tag: string) => update({ tag }) } satisfies TableActions,
    onSortingChange: (updater) => {
      const [next] = resolve(updater, sorting);
      if (next) update({ sort: next.id as SortKey, order: next.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== params.pageSize) update({ pageSize: next.pageSize });
      else update({ page: next.pageIndex + 1 }, { resetPage: false });
    },
  });

  const filtered = Boolean(params.q || params.tag || params.awaiting);

  return (
    <div className="space-y-4">
      <div role="search" aria-label="Filter targets" className="flex flex-wrap items-end gap-4" data-print="hide">
        <TextField
          label="Search"
          type="search"
          value={qDraft}
          onChange={(e) => setQDraft(e.target.value)}
          hint="Designation or notes."
          className="w-64"
        />
        <TextField label="Tag" value={tagDraft} onChange={(e) => setTagDraft(e.target.value)} hint="One tag, exactly." className="w-44" />
        {canReadQueue ? (
          <CheckboxField
            label="Awaiting review"
            hint="Only targets with proposed values."
            checked={params.awaiting === true}
            onChange={(e) => update({ awaiting: e.target.checked ? true : undefined })}
            className="mb-0.5"
          />
        ) : null}
        {filtered ? (
          <Button
            variant="secondary"
            className="mb-5"
            onClick={() => {
              setQDraft('');
              setTagDraft('');
              update({ q: undefined, tag: undefined, awaiting: undefined });
            }}
          >
            Clear filters
          </Button>
        ) : null}
      </div>

      {query.isPending ? <StatusLine>Loading targets…</StatusLine> : null}
      {query.isError && !data ? <QueryError what="The targets" error={query.error} onRetry={() => void query.refetch()} inline /> : null}

      {data && data.total === 0 ? (
        filtered ? (
          <EmptyState title="No targets match these filters">
            {params.awaiting
              ? 'No target has values awaiting review under these filters. Clear the filters to see every target.'
              : 'Change the search text or tag, or clear the filters.'}
          </EmptyState>
        ) : (
          <EmptyState
            title="No targets yet"
            action={
              canEdit ? (
                <Link to={paths.project.newTarget.getHref(projectId)} className={linkClasses}>
                  Add the first target
                </Link>
              ) : null
            }
          >
            {canEdit ? 'Targets are the stars this programme observes.' : 'The project’s observers have not added any targets yet.'}
          </EmptyState>
        )
      ) : null}

      {data && data.total > 0 ? (
        <>
          <p className="text-xs text-ink-soft sm:hidden">
            The table is wider than the screen: scroll it sideways for the values.
          </p>
          <LedgerTable aria-label="Targets" aria-busy={query.isFetching} className={query.isPlaceholderData ? 'opacity-60' : undefined}>
            <LedgerHead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const numeric = (header.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                    const sorted = header.column.getIsSorted();
                    const label = flexRender(header.column.columnDef.header, header.getContext());
                    return (
                      <LedgerHeaderCell
                        key={header.id}
                        scope="col"
                        numeric={numeric}
                        aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      >
                        {header.column.getCanSort() ? (
                          <button
                            type="button"
                            onClick={header.column.getToggleSortingHandler()}
                            className="inline-flex items-center gap-1 hover:text-ink"
                            title={`Sort by ${sortLabels[header.column.id as SortKey]}`}
                          >
                            {label}
                            <span aria-hidden="true" className={sorted ? 'text-brass-deep' : 'opacity-40'}>
                              {sorted === 'desc' ? '▼' : '▲'}
                            </span>
                          </button>
                        ) : (
                          label
                        )}
                      </LedgerHeaderCell>
                    );
                  })}
                </tr>
              ))}
            </LedgerHead>
            <LedgerBody>
              {table.getRowModel().rows.map((row) => (
                <LedgerRow key={row.id}>
                  {row.getVisibleCells().map((cell) => (
                    <LedgerCell key={cell.id} numeric={(cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </LedgerCell>
                  ))}
                </LedgerRow>
              ))}
            </LedgerBody>
          </LedgerTable>

          <Pager
            label="Pages of targets"
            summary={
              <>
                {formatCount(data.total, 'target')}
                {filtered ? ' match' : ''} · page {data.page} of {pageCount}
                {query.isFetching ? ' · updating…' : ''}
              </>
            }
            page={params.page}
            pageCount={pageCount}
            onPage={(next) => table.setPageIndex(next - 1)}
            pageSize={params.pageSize}
            pageSizes={PAGE_SIZES}
            onPageSize={(size) => table.setPageSize(size)}
            pageSizeLabel="Rows per page"
            pageSizeClassName="w-32"
          />
        </>
      ) : null}
      {data || query.isError ? children : null}
    </div>
  );
}
