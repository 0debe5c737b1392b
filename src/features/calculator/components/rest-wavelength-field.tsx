import { useId } from 'react';
import { STRONG_LINES } from '@shared/physics/tables/strong-lines';
import { cn } from '@/lib/cn';
import type { RestEntry, WavelengthUnit } from './calculator-inputs';
import { selectClasses } from './measured-field';

/** Seven significant figures drop the float noise of m → nm and keep every published digit. */
export const nanometres = (wavelengthM: number): string => String(Number((wavelengthM * 1e9).toPrecision(7)));

const UNIT_WORD: Record<WavelengthUnit, string> = { nm: 'nm', angstrom: 'Å', um: 'µm' };

/**
 * The rest wavelength of a line: one of the strong lines (air wavelengths,
 * NIST values as quoted in standard line lists) or a typed value in the
 * group's unit.
 */
export function RestWavelengthField({
  label,
  rest,
  unit,
  onChange,
  vacuumNote,
}: {
  label: string;
  rest: RestEntry;
  unit: WavelengthUnit;
  onChange: (rest: RestEntry) => void;
  /** Shown under the choice, e.g. the line's vacuum wavelength when vacuum is chosen. */
  vacuumNote?: string;
}) {
  const id = useId();
  return (
    <div className="py-2">
      <label htmlFor={`${id}-line`} className="mb-1 block text-sm font-semibold text-ink">
        {label}
      </label>
      <div className="flex flex-wrap items-center gap-2">
        <select id={`${id}-line`} value={rest.line} onChange={(e) => onChange({ ...rest, line: e.target.value })} className={selectClasses}>
          {STRONG_LINES.map((line) => (
            <option key={line.id} value={line.id}>
              {`${line.label} ${nanometres(line.restWavelengthAirM)} nm (air)`}
            </option>
          ))}
          <option value="other">Other line…</option>
        </select>
        {rest.line === 'other' ? (
          <span className="flex items-center gap-2">
            <input
              inputMode="decimal"
              autoComplete="off"
              aria-label={`${label}, typed`}
              value={rest.custom}
              onChange={(e) => onChange({ ...rest, custom: e.target.value })}
              className={cn('w-32 rounded-sm border border-rule bg-paper px-2 py-1.5 text-sm text-ink tabular-nums hover:border-ink-soft')}
            />
            <span className="text-sm text-ink-soft">{UNIT_WORD[unit]}</span>
          </span>
        ) : null}
      </div>
      {vacuumNote ? <p className="mt-1 text-xs text-ink-soft tabular-nums">{vacuumNote}</p> : null}
    </div>
  );
}
