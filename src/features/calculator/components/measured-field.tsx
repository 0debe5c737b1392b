import type { ReactNode } from 'react';
import { Field } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import type { ValueEntry } from './calculator-inputs';
import { Notation } from '@/components/ui/notation';

const inputClasses = (invalid: boolean) =>
  cn(
    'w-full min-w-0 rounded-sm border bg-paper px-2 py-1.5 font-sans text-sm text-ink tabular-nums',
    invalid ? 'border-2 border-alert' : 'border-rule hover:border-ink-soft',
  );

export const selectClasses = 'rounded-sm border border-rule bg-paper px-2 py-1.5 font-sans text-sm text-ink hover:border-ink-soft';

/**
 * One measured quantity: its value, "±", its 1-sigma uncertainty and its
 * unit (fixed text or a choice), with a hint and the reason it was refused.
 */
export function MeasuredField({
  label,
  entry,
  onChange,
  unit,
  hint,
  error,
  placeholder,
}: {
  label: ReactNode;
  entry: ValueEntry;
  onChange: (entry: ValueEntry) => void;
  unit: ReactNode;
  hint?: ReactNode;
  error?: string;
  placeholder?: string;
}) {
  return (
    <Field
      label={label}
      hint={hint}
      error={
        error ? (
          <>
            <span className="font-semibold">Not used:</span> <Notation text={error} />
          </>
        ) : undefined
      }
      className="py-2"
    >
      {(control) => (
        <div className="grid grid-cols-[minmax(0,1fr)_auto_minmax(0,0.8fr)_auto] items-center gap-2">
          <input
            {...control}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            placeholder={placeholder}
            value={entry.value}
            onChange={(e) => onChange({ ...entry, value: e.target.value })}
            className={inputClasses(Boolean(error))}
          />
          <span aria-hidden="true" className="text-ink-soft">
            ±
          </span>
          <input
            id={`${control.id}-sigma`}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            placeholder="σ"
            value={entry.sigma}
            onChange={(e) => onChange({ ...entry, sigma: e.target.value })}
            aria-label={`Uncertainty (1σ) of ${typeof label === 'string' ? label : 'the value'}`}
            aria-describedby={control['aria-describedby']}
            className={inputClasses(false)}
          />
          <span className="min-w-12 text-sm text-ink-soft">{unit}</span>
        </div>
      )}
    </Field>
  );
}

/** A compact unit chooser for a MeasuredField. */
export function UnitSelect<U extends string>({
  label,
  value,
  options,
  onChange,
}: {
  label: string;
  value: U;
  options: ReadonlyArray<{ value: U; label: string }>;
  onChange: (unit: U) => void;
}) {
  return (
    <select aria-label={label} value={value} onChange={(e) => onChange(e.target.value as U)} className={selectClasses}>
      {options.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </select>
  );
}
