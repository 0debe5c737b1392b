import type { DerivedStatus, DerivedValue, Measurement } from '@shared/schemas/derived';
import { formatResult, QUANTITY_NAMES, readableMessage } from '@shared/physics/display';
import type { QuantityId } from '@shared/physics/quantities';
import { Alert } from '@/components/ui/alert';
import { formatDateTime } from '@/lib/format';
import { measurementKindName } from '@/lib/measurement-words';
import { QUANTITY_SECTIONS } from '@/lib/quantity-sections';

export const DERIVED_STATUS_WORDS: Readonly<Record<DerivedStatus, string>> = {
  proposed: 'Proposed',
  approved: 'Approved',
  rejected: 'Rejected',
  superseded: 'Superseded',
};

const isKnownQuantity = (q: string): q is QuantityId => Object.prototype.hasOwnProperty.call(QUANTITY_NAMES, q);

/** The value in astronomers' units, or the stored SI figures when the quantity is not one the display knows. */
function valueTexts(d: DerivedValue): string[] {
  if (!isKnownQuantity(d.quantity) || !Number.isFinite(d.value) || !Number.isFinite(d.uncertainty) || d.uncertainty < 0) {
    return [`${d.value} ± ${d.uncertainty} ${d.unit}`];
  }
  const line = formatResult({ quantity: d.quantity, value: d.value, uncertainty: d.uncertainty, label: d.label ?? undefined });
  const texts = line.values.map((v) => v.text);
  return d.quantity === 'luminosity_class' && line.label ? [`${line.label}: ${texts[0]}`] : texts;
}

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
    const what = `${measurementKindName(m.kind)}${m.band ? ` ${m.band}` : ''}`;
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

function DerivedLine({ value, measurements }: { value: DerivedValue; measurements: ReadonlyMap<number, Measurement> }) {
  const texts = valueTexts(value);
  const name = isKnownQuantity(value.quantity) ? QUANTITY_NAMES[value.quantity] : value.quantity;
  const inputs = inputWords(value.inputs, measurements);
  return (
    <div className="border-b border-rule/60 py-2 break-inside-avoid" data-quantity={value.quantity} data-status={value.status}>
      <dt className="text-sm font-semibold text-ink">{name}</dt>
      <dd>
        <p className="flex flex-wrap items-baseline gap-x-3 text-base text-ink tabular-nums">
          {texts.map((t, i) => (
            <span key={i} className={i === 0 ? 'font-semibold' : 'text-ink-soft'}>
              {i > 0 ? '= ' : ''}
              {t}
            </span>
          ))}
          <span className="rounded-sm border border-rule px-1.5 text-xs font-semibold tracking-wide text-ink uppercase" data-testid="derived-status">
            {DERIVED_STATUS_WORDS[value.status]}
          </span>
        </p>
        <p className="mt-0.5 text-xs text-ink-soft">
          {readableMessage(value.methodLabel)} · revision {value.revision} · {formatDateTime(value.createdAt)}
        </p>
        {inputs.length > 0 ? <p className="mt-0.5 text-xs text-ink-soft">From {inputs.join(' · ')}</p> : null}
        {value.reviewNote || value.reviewedAt ? (
          <p className="mt-0.5 text-xs text-ink">
            <span className="font-semibold">Review{value.reviewedAt ? `, ${formatDateTime(value.reviewedAt)}` : ''}:</span>{' '}
            {value.reviewNote || 'no note'}
          </p>
        ) : null}
        {value.warnings.length > 0 ? (
          <ul className="mt-0.5 space-y-0.5 text-xs">
            {value.warnings.map((w, i) => (
              <li key={i} className="text-alert">
                <span className="font-semibold">Warning:</span> {readableMessage(w.message)}
              </li>
            ))}
          </ul>
        ) : null}
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
 * them: value ± σ in astronomers' units, the method in small type, the
 * revision, the status as a word, then what it came from and its warnings.
 */
export function DerivedValues({ derived, measurements }: { derived: DerivedValue[]; measurements: Measurement[] }) {
  const byId = new Map(measurements.map((m) => [m.id, m]));
  const placed = new Set(QUANTITY_SECTIONS.flatMap((s) => s.quantities as readonly string[]));
  const sections = [
    ...QUANTITY_SECTIONS.map((s) => ({ ...s, values: s.quantities.flatMap((q) => derived.filter((d) => d.quantity === q)) })),
    { title: 'Other quantities', quantities: [], note: undefined, values: derived.filter((d) => !placed.has(d.quantity)) },
  ].filter((s) => s.values.length > 0);

  return (
    <div className="space-y-6">
      {sections.map((s) => (
        <section key={s.title} aria-label={s.title} className="break-inside-avoid-page">
          <h3 className="text-lg font-semibold text-ink">{s.title}</h3>
          {s.note ? <p className="text-xs text-ink-soft">{s.note}</p> : null}
          <dl>
            {s.values.map((v) => (
              <DerivedLine key={v.id} value={v} measurements={byId} />
            ))}
          </dl>
        </section>
      ))}
    </div>
  );
}
