import type { TrailFilters } from '@shared/schemas/trail';
import type { Member } from '@shared/schemas/projects';
import type { Target } from '@shared/schemas/targets';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { actionWords, PROJECT_ACTIONS } from '../trail-words';

const isFiltered = (f: TrailFilters) => Boolean(f.actorId || f.action || f.targetId || f.from || f.to);

/** The problem with a date range, said at the field that has it. */
export function dateRangeError(f: Pick<TrailFilters, 'from' | 'to'>): string | undefined {
  return f.from && f.to && f.to < f.from ? 'The last day is before the first day.' : undefined;
}

/**
 * Who, what, which target and which days. Every choice applies at once and
 * is kept in the address bar by the page, so a filtered trail can be sent to
 * a colleague or exported as it stands.
 */
export function TrailFiltersForm({
  filters,
  people,
  targets,
  onChange,
}: {
  filters: TrailFilters;
  /** The project's members (the route reads them), offered by name. */
  people: Pick<Member, 'userId' | 'name'>[] | undefined;
  /** Every target of the project by id and designation (the route reads them); one missing here was deleted. */
  targets: Pick<Target, 'id' | 'designation'>[] | undefined;
  onChange: (next: Partial<TrailFilters>) => void;
}) {
  const toNumber = (v: string) => (v === '' ? undefined : Number(v));
  // A person or target named in the address but no longer listed (removed, deleted) stays choosable.
  const personListed = !filters.actorId || people?.some((p) => p.userId === filters.actorId);
  const targetListed = !filters.targetId || targets?.some((t) => t.id === filters.targetId);
  const actionListed = !filters.action || (PROJECT_ACTIONS as string[]).includes(filters.action);

  return (
    <div role="search" aria-label="Filter the trail" className="flex flex-wrap items-start gap-x-4 gap-y-3" data-print="hide">
      <SelectField
        label="Person"
        value={filters.actorId ?? ''}
        onChange={(e) => onChange({ actorId: toNumber(e.target.value) })}
        className="w-full sm:w-48"
        hint={people ? undefined : 'Loading the members…'}
      >
        <option value="">Everyone</option>
        {people
          ?.toSorted((a, b) => a.name.localeCompare(b.name))
          .map((p) => (
            <option key={p.userId} value={p.userId}>
              {p.name}
            </option>
          ))}
        {personListed ? null : <option value={filters.actorId}>Account {filters.actorId} (no longer a member)</option>}
      </SelectField>
      <SelectField
        label="Action"
        value={filters.action ?? ''}
        onChange={(e) => onChange({ action: e.target.value || undefined })}
        className="w-full sm:w-48"
      >
        <option value="">Every action</option>
        {PROJECT_ACTIONS.map((a) => (
          <option key={a} value={a}>
            {actionWords(a)}
          </option>
        ))}
        {actionListed ? null : <option value={filters.action}>{filters.action}</option>}
      </SelectField>
      <SelectField
        label="Target"
        value={filters.targetId ?? ''}
        onChange={(e) => onChange({ targetId: toNumber(e.target.value) })}
        className="w-full sm:w-48"
        hint={targets ? undefined : 'Loading the targets…'}
      >
        <option value="">Every target</option>
        {targets?.map((t) => (
          <option key={t.id} value={t.id}>
            {t.designation}
          </option>
        ))}
        {targetListed ? null : <option value={filters.targetId}>Target {filters.targetId} (deleted)</option>}
      </SelectField>
      <TextField
        label="From (UTC)"
        type="date"
        value={filters.from ?? ''}
        max={filters.to}
        onChange={(e) => onChange({ from: e.target.value || undefined })}
        hint="First day, included."
        className="w-[calc(50%-0.5rem)] sm:w-40"
      />
      <TextField
        label="To (UTC)"
        type="date"
        value={filters.to ?? ''}
        min={filters.from}
        onChange={(e) => onChange({ to: e.target.value || undefined })}
        hint="Last day, included."
        error={dateRangeError(filters)}
        className="w-[calc(50%-0.5rem)] sm:w-40"
      />
      {isFiltered(filters) ? (
        <Button
          variant="secondary"
          className="sm:mt-6"
          onClick={() => onChange({ actorId: undefined, action: undefined, targetId: undefined, from: undefined, to: undefined })}
        >
          Clear filters
        </Button>
      ) : null}
    </div>
  );
}
