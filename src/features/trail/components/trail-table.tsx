import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { TrailEntry } from '@shared/schemas/trail';
import type { Member } from '@shared/schemas/projects';
import type { Target } from '@shared/schemas/targets';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { quantityName } from '@/lib/derived-words';
import { formatDateTime } from '@/lib/format';
import { cn } from '@/lib/cn';
import { actionWords, entityWords } from '../trail-words';
import { ChangeDetails, changeSummary } from './trail-change';

const fromRecord = (v: unknown, key: string): string | null => {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return null;
  const x = (v as Record<string, unknown>)[key];
  return typeof x === 'string' && x !== '' ? x : null;
};

/** The target an entry concerns: a link to its sheet while it exists, its recorded name once deleted. */
export function TrailTargetName({ projectId, entry, exists }: { projectId: number; entry: Pick<TrailEntry, 'targetId' | 'targetDesignation'>; exists: boolean }) {
  if (entry.targetId === null) return null;
  const name = entry.targetDesignation ?? `Target ${entry.targetId}`;
  if (!exists) return <span>{name} <span className="text-ink-soft">(deleted)</span></span>;
  return (
    <Link to={paths.project.target.getHref(projectId, entry.targetId)} className={cn(linkClasses, 'font-semibold')}>
      {name}
    </Link>
  );
}

/** What the entry is about, in words: the kind of thing, which one, and the target it belongs to. */
function Subject({ projectId, entry, people, targetExists }: { projectId: number; entry: TrailEntry; people: Map<number, string>; targetExists: boolean }) {
  const kind = entityWords(entry.entityType);
  let detail: ReactNode = null;
  if (entry.entityType === 'derived_value') {
    const quantity = fromRecord(entry.after, 'quantity') ?? fromRecord(entry.before, 'quantity');
    detail = quantity ? quantityName(quantity) : null;
  } else if (entry.entityType === 'upload' && entry.entityId !== null) {
    const file = fromRecord(entry.after, 'filename') ?? fromRecord(entry.before, 'filename');
    detail = (
      <Link to={paths.project.uploadPreview.getHref(projectId, entry.entityId)} className={linkClasses}>
        {file ?? `No. ${entry.entityId}`}
      </Link>
    );
  } else if (entry.entityType === 'member' && entry.entityId !== null) {
    detail = people.get(entry.entityId) ?? fromRecord(entry.after, 'email') ?? fromRecord(entry.before, 'email') ?? `Account ${entry.entityId}`;
  }
  const target = entry.entityType === 'project' && entry.targetId === null ? null : <TrailTargetName projectId={projectId} entry={entry} exists={targetExists} />;
  return (
    <span className="flex flex-wrap items-baseline gap-x-1.5">
      <span className="text-ink-soft">{kind}</span>
      {detail ? <span>{detail}</span> : null}
      {target && entry.targetId !== null ? (
        <span>
          {detail ? <span className="text-ink-soft">of </span> : null}
          {target}
        </span>
      ) : null}
    </span>
  );
}

/** A label shown before each cell on a narrow screen, where the rows stack and the column heads are out of sight. */
function CellLabel({ children }: { children: ReactNode }) {
  return <span className="mr-1 text-xs font-semibold text-ink-soft md:hidden">{children}:</span>;
}

/**
 * One page of the trail as a ledger: time, person, action, subject, the
 * change in a line (with the full record behind a disclosure) and the note.
 * On a narrow screen each entry stacks into a block with its labels.
 */
export function TrailTable({
  projectId,
  entries,
  people,
  targets,
  busy,
}: {
  projectId: number;
  entries: TrailEntry[];
  people: Pick<Member, 'userId' | 'name'>[] | undefined;
  /** Every target of the project by id and designation (the route reads them); one missing here was deleted. */
  targets: Pick<Target, 'id' | 'designation'>[] | undefined;
  busy: boolean;
}) {
  const names = new Map((people ?? []).map((p) => [p.userId, p.name]));
  const existing = new Set((targets ?? []).map((t) => t.id));
  // Until the target list is in, assume a target exists rather than call it deleted.
  const exists = (id: number | null) => id !== null && (targets === undefined || existing.has(id));

  return (
    <LedgerTable aria-label="Review trail, newest first" aria-busy={busy} className={cn('max-md:block', busy && 'opacity-60')}>
      <LedgerHead className="border-b-2 border-ink-soft max-md:sr-only">
        <tr>
          <LedgerHeaderCell scope="col" className="whitespace-nowrap">
            Time (UTC)
          </LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Person</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Action</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Subject</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Change</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Note</LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody className="max-md:block">
        {entries.map((e) => (
          <LedgerRow key={e.id} className="max-md:block max-md:py-2" data-testid="trail-entry">
            <LedgerCell className="tabular-nums whitespace-nowrap max-md:block max-md:px-0 max-md:py-0.5">
              <CellLabel>Time (UTC)</CellLabel>
              <time dateTime={e.createdAt}>{formatDateTime(e.createdAt).replace(' UTC', '')}</time>
            </LedgerCell>
            <LedgerCell className="max-md:block max-md:px-0 max-md:py-0.5">
              <CellLabel>Person</CellLabel>
              {e.actor ? e.actor.name : <span className="text-ink-soft">the system</span>}
            </LedgerCell>
            <LedgerCell className="font-semibold max-md:block max-md:px-0 max-md:py-0.5">
              <CellLabel>Action</CellLabel>
              {actionWords(e.action)}
            </LedgerCell>
            <LedgerCell className="max-md:block max-md:px-0 max-md:py-0.5">
              <CellLabel>Subject</CellLabel>
              <Subject projectId={projectId} entry={e} people={names} targetExists={exists(e.targetId)} />
            </LedgerCell>
            <LedgerCell className="max-w-md max-md:block max-md:max-w-none max-md:px-0 max-md:py-0.5">
              <CellLabel>Change</CellLabel>
              {changeSummary(e) ?? <span className="text-ink-soft">—</span>}
              <ChangeDetails entry={e} />
            </LedgerCell>
            <LedgerCell className="max-w-xs whitespace-pre-wrap max-md:block max-md:max-w-none max-md:px-0 max-md:py-0.5">
              {e.note ? (
                <>
                  <CellLabel>Note</CellLabel>
                  {e.note}
                </>
              ) : (
                <span className="text-ink-soft max-md:hidden">
                  <span aria-hidden="true">—</span>
                  <span className="sr-only">No note</span>
                </span>
              )}
            </LedgerCell>
          </LedgerRow>
        ))}
      </LedgerBody>
    </LedgerTable>
  );
}
