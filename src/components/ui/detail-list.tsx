import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/** Label–value pairs laid out as ruled ledger lines. */
export function DetailList({ children, className }: { children: ReactNode; className?: string }) {
  return <dl className={cn('divide-y divide-rule border-y border-rule', className)}>{children}</dl>;
}

export function DetailItem({ label, children, numeric }: { label: ReactNode; children: ReactNode; numeric?: boolean }) {
  return (
    <div className="grid grid-cols-[minmax(9rem,14rem)_1fr] gap-4 py-2 text-sm">
      <dt className="font-semibold text-ink-soft">{label}</dt>
      <dd className={cn('text-ink', numeric && 'tabular-nums')}>{children}</dd>
    </div>
  );
}
