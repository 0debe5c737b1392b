import type { DerivedValue, Measurement } from '@shared/schemas/derived';
import { QUANTITY_NAMES } from '@shared/physics/display';
import { Alert } from '@/components/ui/alert';
import { DerivedFigures, DerivedWarnings } from '@/components/ui/derived-line';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { DERIVED_STATUS_WORDS, derivedValueTexts, isKnownQuantity, quantityName, sigmaChangeText } from '@/lib/derived-words';
import { formatDateTime } from '@/lib/format';
import { bandName, measurementKindName } from '@/lib/measurement-words';
import { QUANTITY_NOTES, QUANTITY_SECTIONS } from '@/lib/quantity-sections';
import { Notation } from '@/components/ui/notation';

/**
 * What a value was computed from, in words and compactly: measurements
 * grouped by kind and band with the uploads and rows they came from
 * ("Magnitude V: upload 1 rows 4, 7; upload 2 row 2"), then other quantities by name.
 */
function inputWords(inputs: DerivedValue['inputs'], measurements: ReadonlyMap<number, Measurement>): string[] {
  const groups = new Map<string, Map<string, number[]>>();
  const others: string[] = [];
  for (const input of inputs) {
    if (typeof input === 'string') {
      others.push(isKnownQuantity(input) ? QUANTITY_NAMES[input] : input);
      continue;
    }
    const m = measurements.get(input);
    if (!m) {
      others.push(`measurement ${input}`);
      continue;
    }
    const what = `${measurementKindName(m.kind)}${m.band ? ` ${bandName(m.band)}` : ''}`;
    const source = m.uploadId === null ? 'entered directly' : `upload ${m.uploadId}`;
    const bySource = groups.get(what) ?? new Map<string, number[]>();
    const rows = bySource.get(source) ?? [];
    if (m.rowNumber !== null) rows.push(m.rowNumber);
    bySource.set(source, rows);
    groups.set(what, bySource);
  }
  const described = [...groups].map(([what, bySource]) => {
    const sources = [...bySource].map(([source, rows]) => {
      if (source === 'entered directly') return source;
      if (rows.length === 0) return `${source}, spectrum fit`;
      const sorted = [...rows].sort((a, b) => a - b);
      return `${source} ${sorted.length === 1 ? 'row' : 'rows'} ${sorted.join(', ')}`;
    });
    return `${what}: ${sources.join('; ')}`;
  });
  return [...described, ...others];
}

/** Who decided and when, with the note, in one line ("Approved by T. Ferrand, 2026-11-30 21:14 UTC: first sign-off"). */
function reviewWords(value: DerivedValue): string | null {
  if (!value.reviewedAt && !value.reviewNote) return null;
  const verb = value.status === 'rejected' ? 'Rejected' : value.status === 'superseded' ? 'Reviewed' : 'Approved';
  const who = value.reviewer ? ` by ${value.reviewer}` : '';
  const when = value.reviewedAt ? `, ${formatDateTime(value.reviewedAt)}` : '';
  return `${verb}${who}${when}${value.reviewNote ? `: ${value.reviewNote}` : ', without a note'}`;
}

/** One revision as a ledger line: value ± σ, status word, method in small type, inputs, review and warnings. */
function ValueLine({
  value,
  measurements,
  replaces,
}: {
  value: DerivedValue;
  measurements: ReadonlyMap<number, Measurement>;
  /** The approved revision a newer proposal would replace, for the change in σ. */
  replaces?: DerivedValue;
}) {
  const inputs = inputWords(value.inputs, measurements);
  const review = reviewWords(value);
  return (
    <div className="min-w-0" data-quantity={value.quantity} data-status={value.status} data-testid="derived-line">
      <DerivedFigures value={value} />
      {replaces ? <p className="text-xs text-ink">{sigmaChangeText(replaces, value)}</p> : null}
      <p className="mt-0.5 text-xs text-ink-soft">
        <Notation text={value.methodLabel} /> · revision {value.revision} · {formatDateTime(value.createdAt)}
      </p>
      {inputs.length > 0 ? <p className="mt-0.5 text-xs text-ink-soft">From {inputs.join(' · ')}</p> : null}
      {review ? <p className="mt-0.5 text-xs text-ink">{review}</p> : null}
      <DerivedWarnings warnings={value.warnings} className="mt-0.5" />
    </div>
  );
}

/** Every revision of one quantity, newest first, behind a disclosure so the sheet stays short. */
function ReviewHistory({ name, revisions }: { name: string; revisions: readonly DerivedValue[] }) {
  return (
    <details className="mt-2 text-sm" data-testid="review-history" data-print="hide">
      <summary className="cursor-pointer text-brass underline-offset-4 hover:underline">
        Review history<span className="sr-only"> of {name}</span> ({revisions.length === 1 ? '1 revision' : `${revisions.length} revisions`})
      </summary>
      <LedgerTable aria-label={`Review history of ${name}`} className="mt-2 min-w-[46rem]">
        <LedgerHead>
          <tr>
            <LedgerHeaderCell numeric>Revision</LedgerHeaderCell>
            <LedgerHeaderCell>Value</LedgerHeaderCell>
            <LedgerHeaderCell>Status</LedgerHeaderCell>
            <LedgerHeaderCell>Proposed by</LedgerHeaderCell>
            <LedgerHeaderCell>Reviewer</LedgerHeaderCell>
            <LedgerHeaderCell>When (UTC)</LedgerHeaderCell>
            <LedgerHeaderCell>Note</LedgerHeaderCell>
          </tr>
        </LedgerHead>
        <LedgerBody>
          {revisions.map((r) => (
            <LedgerRow key={r.id} data-status={r.status}>
              <LedgerCell numeric>{r.revision}</LedgerCell>
              <LedgerCell className="tabular-nums whitespace-nowrap">{derivedValueTexts(r)[0]}</LedgerCell>
              <LedgerCell>{DERIVED_STATUS_WORDS[r.status]}</LedgerCell>
              <LedgerCell>{r.proposedBy ?? 'derivation engine'}</LedgerCell>
              <LedgerCell>{r.reviewer ?? '—'}</LedgerCell>
              <LedgerCell className="text-xs whitespace-nowrap">
                <span className="block">proposed {formatDateTime(r.createdAt).replace(' UTC', '')}</span>
                {r.reviewedAt ? <span className="block">reviewed {formatDateTime(r.reviewedAt).replace(' UTC', '')}</span> : null}
              </LedgerCell>
              <LedgerCell className="max-w-xs whitespace-pre-wrap">{r.reviewNote || '—'}</LedgerCell>
            </LedgerRow>
          ))}
        </LedgerBody>
      </LedgerTable>
    </details>
  );
}

/** One quantity's revisions (newest first), the approved one in force, and a newer proposal or rejection if there is one. */
interface QuantityState {
  quantity: string;
  approved: DerivedValue | null;
  newer: DerivedValue | null;
  revisions: DerivedValue[];
}

function quantityStates(revisions: readonly DerivedValue[]): Map<string, QuantityState> {
  const states = new Map<string, QuantityState>();
  for (const r of revisions) {
    const state = states.get(r.quantity) ?? { quantity: r.quantity, approved: null, newer: null, revisions: [] };
    state.revisions.push(r);
    states.set(r.quantity, state);
  }
  for (const state of states.values()) {
    state.revisions.sort((a, b) => b.revision - a.revision);
    state.approved = state.revisions.find((r) => r.status === 'approved') ?? null;
    const after = state.revisions.filter((r) => r.revision > (state.approved?.revision ?? 0));
    state.newer = after.find((r) => r.status === 'proposed') ?? after.find((r) => r.status === 'rejected') ?? null;
  }
  return states;
}

/**
 * The state of one quantity at a glance: the approved revision in force
 * and, when a newer proposal (or a newer rejection) exists, that revision
 * beside it; then its review history.
 */
function QuantityLine({ state, measurements }: { state: QuantityState; measurements: ReadonlyMap<number, Measurement> }) {
  const name = quantityName(state.quantity);
  const { approved, newer } = state;
  return (
    <div className="border-b border-rule/60 py-2 break-inside-avoid" data-testid="derived-quantity" data-quantity-state={state.quantity}>
      <dt className="text-sm font-semibold text-ink">{name}</dt>
      <dd>
        <div className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
          {approved ? <ValueLine value={approved} measurements={measurements} /> : null}
          {newer ? (
            <div className={approved ? 'border-l-2 border-rule pl-3' : undefined}>
              {approved ? <p className="text-xs font-semibold text-ink-soft">Newer revision</p> : null}
              <ValueLine value={newer} measurements={measurements} replaces={approved && newer.status === 'proposed' ? approved : undefined} />
              {approved ? null : <p className="text-xs text-ink-soft italic">None approved yet.</p>}
            </div>
          ) : null}
          {!approved && !newer && state.revisions[0] ? <ValueLine value={state.revisions[0]} measurements={measurements} /> : null}
        </div>
        {isKnownQuantity(state.quantity) && QUANTITY_NOTES[state.quantity] ? (
          <p className="mt-1 max-w-prose text-xs text-ink-soft italic" data-testid="quantity-note">
            {QUANTITY_NOTES[state.quantity]}
          </p>
        ) : null}
        <ReviewHistory name={name} revisions={state.revisions} />
      </dd>
    </div>
  );
}

/** The caution every target sheet carries beside its derived values. */
export function ModelCaution({ className }: { className?: string }) {
  return (
    <Alert kind="notice" title="Derived values are estimates from simple models." className={className}>
      Each line names the model it comes from and lists its warnings; read them before trusting a number. Approved values are the lead
      astronomer’s sign-off, not a reduction: for publication, defer to the team’s own reduction practice.
    </Alert>
  );
}

/**
 * A target's derived values as ledger lines, grouped as an astronomer reads
 * them: per quantity the approved value in force and any newer proposal
 * beside it, value ± σ in astronomers' units, the method in small type, the
 * revision, the status as a word, then what it came from, its warnings and
 * its review history. `revisions` is every revision the caller may see
 * (readers are sent approved ones only).
 */
export function DerivedValues({ revisions, measurements }: { revisions: DerivedValue[]; measurements: Measurement[] }) {
  const byId = new Map(measurements.map((m) => [m.id, m]));
  const states = quantityStates(revisions);
  const placed = new Set(QUANTITY_SECTIONS.flatMap((s) => s.quantities as readonly string[]));
  const sections = [
    ...QUANTITY_SECTIONS.map((s) => ({ ...s, states: s.quantities.flatMap((q) => states.get(q) ?? []) })),
    { title: 'Other quantities', quantities: [], note: undefined, states: [...states.values()].filter((st) => !placed.has(st.quantity)) },
  ].filter((s) => s.states.length > 0);

  return (
    <div className="space-y-6">
      {sections.map((s) => (
        <section key={s.title} aria-label={s.title} className="break-inside-avoid-page">
          <h3 className="text-lg font-semibold text-ink">{s.title}</h3>
          {s.note ? <p className="text-xs text-ink-soft">{s.note}</p> : null}
          <dl>
            {s.states.map((st) => (
              <QuantityLine key={st.quantity} state={st} measurements={byId} />
            ))}
          </dl>
        </section>
      ))}
    </div>
  );
}
