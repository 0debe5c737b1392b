import { useEffect, useEffectEvent, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { QueueItem, ReviewQueueQuery } from '@shared/schemas/derived';
import { QUANTITY_IDS } from '@shared/physics/quantities';
import { paths } from '@/config/paths';
import { StatusLine } from '@/components/ui/alert';
import { Button, linkClasses } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField } from '@/components/ui/field';
import { Pager } from '@/components/ui/pager';
import { QueryError } from '@/components/errors/query-error';
import { quantityName, quantityNameInText } from '@/lib/derived-words';
import { formatCount } from '@/lib/format';
import { PAGE_SIZES, readPageParams, writePageParams } from '@/lib/page-params';
import { useReviewQueue } from '../api/get-review-queue';
import type { ReviewQueueParams } from '../api/keys';
import { DecisionPanel, type DecisionOutcome } from './decision-panel';
import { QueueItemLine } from './queue-item';

type WarningsFilter = ReviewQueueQuery['warnings'];
const WARNING_FILTERS: readonly { value: WarningsFilter; label: string }[] = [
  { value: 'any', label: 'With or without warnings' },
  { value: 'with', label: 'Only values with warnings' },
  { value: 'without', label: 'Only values without warnings' },
];

/*
 * Filters and page live in the address bar, so a filtered queue can be
 * bookmarked or sent to a colleague ("everything for GW 104"), and Back
 * returns to it.
 */
function readParams(search: URLSearchParams): ReviewQueueParams {
  const targetId = Number.parseInt(search.get('target') ?? '', 10);
  const quantity = search.get('quantity') ?? '';
  const warnings = search.get('warnings');
  return {
    ...readPageParams(search),
    targetId: Number.isFinite(targetId) && targetId >= 1 ? targetId : undefined,
    quantity: (QUANTITY_IDS as readonly string[]).includes(quantity) ? quantity : undefined,
    warnings: warnings === 'with' || warnings === 'without' ? warnings : 'any',
  };
}

function writeParams(params: ReviewQueueParams): URLSearchParams {
  const search = new URLSearchParams();
  writePageParams(search, params);
  if (params.targetId !== undefined) search.set('target', String(params.targetId));
  if (params.quantity) search.set('quantity', params.quantity);
  if (params.warnings !== 'any') search.set('warnings', params.warnings);
  return search;
}

/** Consecutive items of one target (the server orders the queue by target), each group under its own heading. */
function groupByTarget(items: readonly QueueItem[]) {
  const groups: { target: QueueItem['target']; items: QueueItem[] }[] = [];
  for (const item of items) {
    const last = groups.at(-1);
    if (last && last.target.id === item.target.id) last.items.push(item);
    else groups.push({ target: item.target, items: [item] });
  }
  return groups;
}

const MAX_NAMED = 6;

function outcomeWords({ decision, result }: DecisionOutcome, designationOf: (targetId: number) => string): string {
  const names = result.decided.map((d) => `${designationOf(d.targetId)} ${quantityNameInText(d.quantity)} r${d.revision}`);
  const listed = names.length > MAX_NAMED ? `${names.slice(0, MAX_NAMED).join('; ')} and ${names.length - MAX_NAMED} more` : names.join('; ');
  const verb = decision === 'approve' ? 'Approved' : 'Rejected';
  const superseded =
    result.superseded.length > 0 ? ` ${formatCount(result.superseded.length, 'earlier approved revision')} superseded.` : '';
  return `${verb} ${formatCount(result.decided.length, 'value')}: ${listed}.${superseded}`;
}

/** A group's "select this target" box, showing mixed when only some of its values are selected. */
function GroupCheckbox({
  id,
  designation,
  count,
  state,
  onChange,
}: {
  id: string;
  designation: string;
  count: number;
  state: 'none' | 'some' | 'all';
  onChange: (checked: boolean) => void;
}) {
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (ref.current) ref.current.indeterminate = state === 'some';
  }, [state]);
  return (
    <span className="flex items-center gap-2 text-sm">
      <input
        ref={ref}
        id={id}
        type="checkbox"
        className="size-4 accent-[var(--sl-brass)]"
        checked={state === 'all'}
        onChange={(e) => onChange(e.target.checked)}
      />
      <label htmlFor={id} className="text-ink">
        Select {count === 1 ? 'the value' : `all ${count} values`} of {designation}
      </label>
    </span>
  );
}

/**
 * The review queue: proposed values grouped by target, each beside the
 * approved value it would replace. The lead selects one, several or a whole
 * target and decides in the panel beside the list; observers read the same
 * list without controls. After a decision, focus goes to the value that
 * now stands where the first decided one stood, and the status line says
 * what was done.
 */
export function ReviewQueue({
  projectId,
  canReview,
  targets,
}: {
  projectId: number;
  canReview: boolean;
  /** Every target of the project, for the target filter; the queue itself names the ones it lists. */
  targets: readonly { id: number; designation: string }[] | undefined;
}) {
  const [searchParams, setSearchParams] = useSearchParams();
  const params = readParams(searchParams);
  const paramsKey = writeParams(params).toString();
  const update = (next: Partial<ReviewQueueParams>, { resetPage = true } = {}) =>
    setSearchParams(writeParams({ ...params, ...(resetPage ? { page: 1 } : {}), ...next }), { replace: true });

  const query = useReviewQueue(projectId, params);
  const data = query.data;
  const items = data?.items ?? [];
  const pageCount = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;

  // A selection belongs to the page it was made on; another filter or page starts afresh.
  const [selection, setSelection] = useState<{ key: string; ids: ReadonlySet<number> }>({ key: paramsKey, ids: new Set() });
  const selectedIds = selection.key === paramsKey ? selection.ids : new Set<number>();
  // Only what is on screen can be decided: a value that left the queue (decided elsewhere, superseded) drops out.
  const selected = items.filter((i) => selectedIds.has(i.proposed.id));
  const setSelected = (mutate: (ids: Set<number>) => void) => {
    const ids = new Set(selected.map((i) => i.proposed.id));
    mutate(ids);
    setSelection({ key: paramsKey, ids });
  };

  const designationOf = (targetId: number) =>
    items.find((i) => i.target.id === targetId)?.target.designation ??
    targets?.find((t) => t.id === targetId)?.designation ??
    `target ${targetId}`;

  const [announcement, setAnnouncement] = useState('');
  const statusRef = useRef<HTMLParagraphElement>(null);
  const checkboxes = useRef(new Map<number, HTMLInputElement>());
  // Where focus goes once the queue has been refetched after a decision: the position of the first decided value.
  const focusAt = useRef<number | null>(null);
  useEffect(() => {
    if (focusAt.current === null || query.isFetching) return;
    const next = items[Math.min(focusAt.current, items.length - 1)];
    const box = next ? checkboxes.current.get(next.proposed.id) : undefined;
    if (box) box.focus();
    else statusRef.current?.focus();
    focusAt.current = null;
  });

  // A page emptied by decisions (or a stale bookmark) falls back to the last page there is.
  const clampPage = useEffectEvent((lastPage: number) => update({ page: lastPage }, { resetPage: false }));
  useEffect(() => {
    if (data && data.total > 0 && data.page > pageCount) clampPage(pageCount);
  }, [data, pageCount]);

  const filtered = params.targetId !== undefined || params.quantity !== undefined || params.warnings !== 'any';
  const groups = groupByTarget(items);

  return (
    <div className="space-y-4">
      <div role="search" aria-label="Filter the review queue" className="flex flex-wrap items-end gap-4" data-print="hide">
        <SelectField
          label="Target"
          value={params.targetId ?? ''}
          onChange={(e) => update({ targetId: e.target.value ? Number(e.target.value) : undefined })}
          className="w-48"
        >
          <option value="">All targets</option>
          {params.targetId !== undefined && !(targets ?? []).some((t) => t.id === params.targetId) ? (
            <option value={params.targetId}>{designationOf(params.targetId)}</option>
          ) : null}
          {(targets ?? []).map((t) => (
            <option key={t.id} value={t.id}>
              {t.designation}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Quantity"
          value={params.quantity ?? ''}
          onChange={(e) => update({ quantity: e.target.value || undefined })}
          className="w-72"
        >
          <option value="">All quantities</option>
          {QUANTITY_IDS.map((q) => (
            <option key={q} value={q}>
              {quantityName(q)}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Warnings"
          value={params.warnings}
          onChange={(e) => update({ warnings: e.target.value as WarningsFilter })}
          className="w-64"
        >
          {WARNING_FILTERS.map((w) => (
            <option key={w.value} value={w.value}>
              {w.label}
            </option>
          ))}
        </SelectField>
        {filtered ? (
          <Button variant="secondary" onClick={() => update({ targetId: undefined, quantity: undefined, warnings: 'any' })}>
            Clear filters
          </Button>
        ) : null}
      </div>

      {canReview ? (
        // The list can be long; keyboard users jump from here to the note and the two decisions.
        <a
          href="#decision-heading"
          className="sr-only rounded-sm bg-paper px-2 py-1 text-sm text-brass focus:not-sr-only focus:inline-block"
        >
          Skip to the decision
        </a>
      ) : (
        <p className="text-sm text-ink" data-testid="read-only-line">
          Only the lead astronomer approves or rejects values; this list shows what awaits their review.
        </p>
      )}

      <p ref={statusRef} role="status" tabIndex={-1} className="text-sm text-ink" data-testid="review-status">
        {announcement ? (
          <>
            <span className="font-semibold text-good">Done:</span> {announcement}
          </>
        ) : null}
      </p>

      {query.isPending ? <StatusLine>Loading the review queue…</StatusLine> : null}
      {query.isError ? <QueryError what="The review queue" error={query.error} onRetry={() => void query.refetch()} /> : null}

      {data ? (
        <div className={canReview ? 'grid gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]' : undefined}>
          <div className="min-w-0">
            {data.total === 0 ? (
              filtered ? (
                <EmptyState title="No proposed values match these filters">Clear a filter to see the rest of the queue.</EmptyState>
              ) : (
                <EmptyState title="Nothing awaits review">
                  Every proposed value of this project has been decided. New proposals appear here when measurements are committed or
                  derivations are re-run.
                </EmptyState>
              )
            ) : (
              <>
                <p className="text-sm text-ink-soft">
                  {formatCount(data.total, 'proposed value')}
                  {filtered ? (data.total === 1 ? ' matches' : ' match') : data.total === 1 ? ' awaits review' : ' await review'} · page{' '}
                  {data.page} of {pageCount}
                  {query.isFetching ? ' · updating…' : ''}
                </p>
                {groups.map((g) => {
                  const ids = g.items.map((i) => i.proposed.id);
                  const chosen = ids.filter((id) => selectedIds.has(id)).length;
                  const headingId = `queue-target-${g.target.id}`;
                  return (
                    <section key={g.target.id} aria-labelledby={headingId} className="mt-6" data-testid="queue-group">
                      <div className="flex flex-wrap items-baseline justify-between gap-3 border-b border-ink-soft pb-1">
                        <h2 id={headingId} className="text-xl font-semibold text-ink">
                          <Link to={paths.project.target.getHref(projectId, g.target.id)} className={linkClasses}>
                            {g.target.designation}
                          </Link>
                        </h2>
                        {canReview ? (
                          <GroupCheckbox
                            id={`queue-select-${g.target.id}`}
                            designation={g.target.designation}
                            count={ids.length}
                            state={chosen === 0 ? 'none' : chosen === ids.length ? 'all' : 'some'}
                            onChange={(checked) => setSelected((s) => ids.forEach((id) => (checked ? s.add(id) : s.delete(id))))}
                          />
                        ) : null}
                      </div>
                      <ul aria-label={`Proposed values of ${g.target.designation}`}>
                        {g.items.map((item) => (
                          <QueueItemLine
                            key={item.proposed.id}
                            projectId={projectId}
                            item={item}
                            {...(canReview
                              ? {
                                  selected: selectedIds.has(item.proposed.id),
                                  onToggle: (checked: boolean) =>
                                    setSelected((s) => (checked ? s.add(item.proposed.id) : s.delete(item.proposed.id))),
                                  checkboxRef: (el: HTMLInputElement | null) => {
                                    if (el) checkboxes.current.set(item.proposed.id, el);
                                    else checkboxes.current.delete(item.proposed.id);
                                  },
                                }
                              : {})}
                          />
                        ))}
                      </ul>
                    </section>
                  );
                })}
              </>
            )}
            {data.total > 0 ? (
              <Pager
                label="Pages of the review queue"
                className="mt-4"
                page={params.page}
                pageCount={pageCount}
                onPage={(next) => update({ page: next }, { resetPage: false })}
                pageSize={params.pageSize}
                pageSizes={PAGE_SIZES}
                onPageSize={(size) => update({ pageSize: size })}
                pageSizeLabel="Values per page"
              />
            ) : null}
            {canReview && selected.length > 0 ? (
              // On a narrow screen the decision panel comes after the whole list; this bar keeps it one step away.
              <div className="sticky bottom-0 mt-4 flex items-center justify-between gap-3 border-t border-rule bg-paper-deep px-3 py-2 text-sm lg:hidden">
                <span>{formatCount(selected.length, 'value')} selected</span>
                <a href="#decision-heading" className={linkClasses}>
                  Go to the decision
                </a>
              </div>
            ) : null}
          </div>
          {canReview ? (
            <div className="self-start lg:sticky lg:top-4">
              <DecisionPanel
                projectId={projectId}
                selected={selected}
                designationOf={designationOf}
                onStale={() => setAnnouncement('')}
                onDecided={(outcome) => {
                  const decidedIds = new Set(outcome.result.decided.map((d) => d.id));
                  const firstIndex = items.findIndex((i) => decidedIds.has(i.proposed.id));
                  setAnnouncement(outcomeWords(outcome, designationOf));
                  setSelected((s) => decidedIds.forEach((id) => s.delete(id)));
                  focusAt.current = firstIndex >= 0 ? firstIndex : 0;
                }}
              />
            </div>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
