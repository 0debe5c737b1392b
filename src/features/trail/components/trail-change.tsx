import type { ReactNode } from 'react';
import type { TrailEntry } from '@shared/schemas/trail';
import { derivedValueTexts, quantityName, DERIVED_STATUS_WORDS } from '@/lib/derived-words';
import type { DerivedStatus } from '@shared/schemas/derived';
import { fieldWords } from '../trail-words';

/*
 * The short "before → after" line of a trail entry. Entries carry whatever
 * their action recorded (a target's fields, a value's summary, a member's
 * role), so the line is built from what is there: the fields that changed,
 * or what was created or removed, with the full record a click away.
 */

type Record_ = Record<string, unknown>;
const isRecord = (v: unknown): v is Record_ => typeof v === 'object' && v !== null && !Array.isArray(v);

/** A derived value as the trail summarises it (quantity, revision, value ± σ, unit, status). */
interface ValueSummary {
  quantity: string;
  revision?: number;
  value?: number;
  uncertainty?: number;
  unit?: string;
  label?: string | null;
  status?: string;
}

const isValueSummary = (v: unknown): v is ValueSummary => isRecord(v) && typeof v.quantity === 'string';

export function FieldName({ field }: { field: string }) {
  if (field === 'rV') {
    return (
      <>
        R<sub>V</sub>
      </>
    );
  }
  return <>{fieldWords(field)}</>;
}

function shortText(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string') return value.length > 48 ? `“${value.slice(0, 47)}…”` : `“${value}”`;
  if (typeof value === 'number') return String(value).replace('-', '−');
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) return value.length === 0 ? 'none' : value.map((v) => (typeof v === 'string' ? v : JSON.stringify(v))).join(', ');
  return '…';
}

/** The field of `before` that `after`'s field changed (a target's edit sends `ra`, the target holds `raDeg`). */
const BEFORE_NAMES: Record<string, string> = { ra: 'raDeg', dec: 'decDeg' };

interface Change {
  field: string;
  before?: unknown;
  after?: unknown;
}

/** Changed fields, one level into nested records (a site's latitude). */
function changes(before: Record_, after: Record_): Change[] {
  const out: Change[] = [];
  for (const [key, next] of Object.entries(after)) {
    const prev = before[BEFORE_NAMES[key] ?? key] ?? before[key];
    if (isRecord(next) && isRecord(prev)) {
      for (const sub of changes(prev, next)) out.push({ ...sub, field: `${key}.${sub.field}` });
    } else if (JSON.stringify(prev) !== JSON.stringify(next)) {
      out.push({ field: key, before: prev, after: next });
    }
  }
  return out;
}

function statusWord(status: unknown): string | null {
  return typeof status === 'string' && status in DERIVED_STATUS_WORDS ? DERIVED_STATUS_WORDS[status as DerivedStatus].toLowerCase() : null;
}

function valueLine(v: ValueSummary): string {
  const name = `${quantityName(v.quantity)}${v.revision ? ` r${v.revision}` : ''}`;
  if (typeof v.value !== 'number' || typeof v.uncertainty !== 'number' || typeof v.unit !== 'string') return name;
  const [text] = derivedValueTexts({ quantity: v.quantity, value: v.value, uncertainty: v.uncertainty, unit: v.unit, label: v.label ?? null });
  return `${name}: ${text}`;
}

function FieldLabel({ field }: { field: string }) {
  const parts = field.split('.');
  return (
    <>
      {parts.map((p, i) => (
        <span key={p}>
          {i > 0 ? ' ' : null}
          <FieldName field={p} />
        </span>
      ))}
    </>
  );
}

function pairs(record: Record_, limit = 4): ReactNode {
  const shown = Object.entries(record).filter(([, v]) => v !== undefined && v !== '' && !isRecord(v));
  return (
    <>
      {shown.slice(0, limit).map(([k, v], i) => (
        <span key={k}>
          {i > 0 ? '; ' : null}
          <FieldLabel field={k} /> {shortText(v)}
        </span>
      ))}
      {shown.length > limit ? '; …' : null}
    </>
  );
}

/** The one-line summary of what an entry changed. */
export function changeSummary(entry: Pick<TrailEntry, 'before' | 'after'>): ReactNode {
  const { before, after } = entry;
  if (isValueSummary(after) || isValueSummary(before)) {
    const v = (isValueSummary(after) && typeof after.value === 'number' ? after : before) as ValueSummary;
    const from = statusWord(isValueSummary(before) ? before.status : undefined);
    const to = statusWord(isValueSummary(after) ? after.status : undefined);
    return (
      <>
        {valueLine(v)}
        {from && to && from !== to ? ` — ${from} → ${to}` : to ? ` — ${to}` : null}
      </>
    );
  }
  if (isRecord(before) && isRecord(after)) {
    const list = changes(before, after);
    if (list.length === 0) return 'No field changed.';
    return (
      <>
        {list.slice(0, 3).map((c, i) => (
          <span key={c.field}>
            {i > 0 ? '; ' : null}
            <FieldLabel field={c.field} /> {shortText(c.before)} → {shortText(c.after)}
          </span>
        ))}
        {list.length > 3 ? `; and ${list.length - 3} more` : null}
      </>
    );
  }
  if (isRecord(after)) return pairs(after);
  if (isRecord(before)) return <>Was: {pairs(before)}</>;
  if (after !== null && after !== undefined) return shortText(after);
  return null;
}

/** The full before and after, pretty-printed, behind a disclosure so the table stays readable. */
export function ChangeDetails({ entry }: { entry: Pick<TrailEntry, 'id' | 'before' | 'after'> }) {
  if ((entry.before === null || entry.before === undefined) && (entry.after === null || entry.after === undefined)) return null;
  return (
    <details className="mt-1 text-xs">
      <summary className="cursor-pointer text-ink-soft underline decoration-rule underline-offset-4 hover:text-ink hover:decoration-brass">
        Before and after<span className="sr-only"> of entry {entry.id}</span>
      </summary>
      <div className="mt-2 grid gap-2">
        {(['before', 'after'] as const).map((side) => (
          <div key={side} className="min-w-0">
            <p className="font-semibold text-ink-soft">{side === 'before' ? 'Before' : 'After'}</p>
            <pre
              tabIndex={0}
              aria-label={`${side === 'before' ? 'Before' : 'After'}, as recorded`}
              className="mt-1 max-h-64 overflow-auto rounded-sm border border-rule bg-paper-deep p-2 font-mono text-xs whitespace-pre-wrap break-words text-ink"
            >
              {entry[side] === null || entry[side] === undefined ? '(nothing recorded)' : JSON.stringify(entry[side], null, 2)}
            </pre>
          </div>
        ))}
      </div>
    </details>
  );
}
