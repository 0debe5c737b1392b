import type { Ref } from 'react';
import { Link } from 'react-router-dom';
import type { InputProvenance, QueueItem } from '@shared/schemas/derived';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';
import { DerivedFigures, DerivedWarnings } from '@/components/ui/derived-line';
import { derivedValueTexts, quantityName, quantityNameInText, sigmaChangeText } from '@/lib/derived-words';
import { bandName, measurementKindName } from '@/lib/measurement-words';
import { Notation } from '@/components/ui/notation';

/** Input measurements grouped by what was measured, then by the upload they came from, rows listed together. */
function groupProvenance(provenance: InputProvenance[]) {
  const groups = new Map<string, Map<string, { uploadId: number | null; filename: string | null; rows: number[] }>>();
  for (const p of provenance) {
    const what = `${measurementKindName(p.kind)}${p.band ? ` ${bandName(p.band)}` : ''}`;
    const sources = groups.get(what) ?? new Map<string, { uploadId: number | null; filename: string | null; rows: number[] }>();
    const key = String(p.uploadId ?? 'direct');
    const source = sources.get(key) ?? { uploadId: p.uploadId, filename: p.uploadFilename, rows: [] };
    if (p.rowNumber !== null) source.rows.push(p.rowNumber);
    sources.set(key, source);
    groups.set(what, sources);
  }
  return [...groups].map(([what, sources]) => ({
    what,
    sources: [...sources.values()].map((s) => ({ ...s, rows: [...s.rows].sort((a, b) => a - b) })),
  }));
}

function Inputs({ projectId, item }: { projectId: number; item: QueueItem }) {
  const measured = groupProvenance(item.provenance);
  const computedFrom = item.proposed.dependsOn;
  if (measured.length === 0 && computedFrom.length === 0) return null;
  return (
    <div className="mt-1 text-xs text-ink-soft">
      {measured.length > 0 ? (
        <p>
          <span className="font-semibold">Measured inputs:</span>{' '}
          {measured.map((g, i) => (
            <span key={g.what}>
              {i > 0 ? ' · ' : ''}
              {g.what}:{' '}
              {g.sources.map((source, j) => (
                <span key={source.uploadId ?? 'direct'}>
                  {j > 0 ? '; ' : ''}
                  {source.uploadId === null ? (
                    'entered directly'
                  ) : (
                    <>
                      <Link className={linkClasses} to={paths.project.uploadPreview.getHref(projectId, source.uploadId)}>
                        {source.filename ?? `upload ${source.uploadId}`}
                      </Link>
                      {source.rows.length === 0 ? ', spectrum fit' : ` ${source.rows.length === 1 ? 'row' : 'rows'} ${source.rows.join(', ')}`}
                    </>
                  )}
                </span>
              ))}
            </span>
          ))}
        </p>
      ) : null}
      {computedFrom.length > 0 ? (
        <p>
          <span className="font-semibold">Computed from:</span> {computedFrom.map(quantityNameInText).join(', ')}
        </p>
      ) : null}
    </div>
  );
}

/**
 * One proposed value as a ledger line: quantity, value ± σ, the approved
 * value it would replace and how σ changes, the method in small type, what
 * it came from (upload and row), its warnings in words and its revision.
 * With `onToggle` it carries the checkbox the lead selects it with.
 */
export function QueueItemLine({
  projectId,
  item,
  selected,
  onToggle,
  checkboxRef,
}: {
  projectId: number;
  item: QueueItem;
  selected?: boolean;
  onToggle?: (checked: boolean) => void;
  checkboxRef?: Ref<HTMLInputElement>;
}) {
  const { proposed, approved } = item;
  const name = quantityName(proposed.quantity);
  const checkboxId = `queue-item-${proposed.id}`;
  return (
    <li
      className="flex gap-3 border-b border-rule/60 py-3"
      data-testid="queue-item"
      data-quantity={proposed.quantity}
      data-value-id={proposed.id}
    >
      {onToggle ? (
        <input
          ref={checkboxRef}
          id={checkboxId}
          type="checkbox"
          className="mt-1 size-4 shrink-0 accent-[var(--sl-brass)]"
          checked={selected ?? false}
          onChange={(e) => onToggle(e.target.checked)}
        />
      ) : null}
      <div className="min-w-0 flex-1">
        <p className="flex flex-wrap items-baseline justify-between gap-x-3">
          {onToggle ? (
            <label htmlFor={checkboxId} className="text-sm font-semibold text-ink">
              {name}
              <span className="sr-only">
                {' '}
                of {item.target.designation}, revision {proposed.revision}
              </span>
            </label>
          ) : (
            <span className="text-sm font-semibold text-ink">{name}</span>
          )}
          <span className="text-xs text-ink-soft">
            revision {proposed.revision}
            {proposed.proposedBy ? ` · proposed by ${proposed.proposedBy}` : ''} · {formatDateTime(proposed.createdAt)}
          </span>
        </p>
        <div className="mt-1 grid gap-x-6 gap-y-1 sm:grid-cols-2">
          <DerivedFigures value={proposed} dense data-testid="queue-proposed" />
          <p className="text-sm text-ink-soft tabular-nums" data-testid="queue-approved">
            {approved ? (
              <>
                <span className="text-xs">Would replace </span>
                <span className="text-ink">{derivedValueTexts(approved)[0]}</span>
                <span className="text-xs"> approved, revision {approved.revision}</span>
                <span className="block text-xs text-ink" data-testid="queue-sigma-change">
                  {sigmaChangeText(approved, proposed)}
                </span>
              </>
            ) : (
              <span className="text-xs italic">None approved yet.</span>
            )}
          </p>
        </div>
        <p className="mt-1 text-xs text-ink-soft"><Notation text={proposed.methodLabel} /></p>
        <Inputs projectId={projectId} item={item} />
        {item.upstream.length > 0 ? (
          <p className="mt-1 text-xs text-ink">
            <span className="font-semibold">Approving it also approves:</span>{' '}
            {item.upstream.map((u) => `${quantityNameInText(u.quantity)} r${u.revision}`).join(', ')}
          </p>
        ) : null}
        <DerivedWarnings warnings={proposed.warnings} className="mt-1" data-testid="queue-warnings" />
      </div>
    </li>
  );
}
