import type { ComponentProps } from 'react';
import type { DerivedValue } from '@shared/schemas/derived';
import { cn } from '@/lib/cn';
import { DERIVED_STATUS_WORDS, derivedValueTexts } from '@/lib/derived-words';
import { Notation } from './notation';

/*
 * The parts of a derived value's ledger line that the target sheet and the
 * review queue both print, so one revision reads the same on either page.
 */

/**
 * Value ± σ in each display unit ("= 9.9 pc = 32.2 ly"), then the status as
 * a word. `dense` is the queue's tighter line, where the other units are in
 * small type.
 */
export function DerivedFigures({
  value,
  dense = false,
  className,
  ...props
}: { value: Pick<DerivedValue, 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label' | 'status'>; dense?: boolean } & ComponentProps<'p'>) {
  return (
    <p className={cn('flex flex-wrap items-baseline text-base text-ink tabular-nums', dense ? 'gap-x-2' : 'gap-x-3', className)} {...props}>
      {derivedValueTexts(value).map((t, i) => (
        <span key={i} className={i === 0 ? 'font-semibold' : dense ? 'text-sm text-ink-soft' : 'text-ink-soft'}>
          {i > 0 ? '= ' : ''}
          {t}
        </span>
      ))}
      <span className="rounded-sm border border-rule px-1.5 text-xs font-semibold tracking-wide text-ink uppercase" data-testid="derived-status">
        {DERIVED_STATUS_WORDS[value.status]}
      </span>
    </p>
  );
}

/** A value's warnings, each said as a warning in words, not by colour alone. */
export function DerivedWarnings({ warnings, className, ...props }: { warnings: DerivedValue['warnings'] } & ComponentProps<'ul'>) {
  if (warnings.length === 0) return null;
  return (
    <ul className={cn('space-y-0.5 text-xs', className)} {...props}>
      {warnings.map((w, i) => (
        <li key={i} className="text-alert">
          <span className="font-semibold">Warning:</span> <Notation text={w.message} />
        </li>
      ))}
    </ul>
  );
}
