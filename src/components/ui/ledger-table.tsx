import type { ComponentProps } from 'react';
import { cn } from '@/lib/cn';

/*
 * Tables drawn as ledger pages: ruled lines between entries, a heavier rule
 * under the column heads, figures right-aligned in tabular digits.
 */

export function LedgerTable({ className, ...props }: ComponentProps<'table'>) {
  return (
    <div className="overflow-x-auto">
      <table className={cn('w-full border-collapse text-sm', className)} {...props} />
    </div>
  );
}

export function LedgerHead(props: ComponentProps<'thead'>) {
  return <thead className="border-b-2 border-ink-soft" {...props} />;
}

export function LedgerBody(props: ComponentProps<'tbody'>) {
  return <tbody {...props} />;
}

export function LedgerRow({ className, ...props }: ComponentProps<'tr'>) {
  return <tr className={cn('border-b border-rule hover:bg-paper-deep/60', className)} {...props} />;
}

export function LedgerHeaderCell({ className, numeric, ...props }: ComponentProps<'th'> & { numeric?: boolean }) {
  return (
    <th
      className={cn(
        'px-3 py-2 text-xs font-semibold tracking-wide text-ink-soft',
        numeric ? 'text-right' : 'text-left',
        className,
      )}
      {...props}
    />
  );
}

export function LedgerCell({ className, numeric, ...props }: ComponentProps<'td'> & { numeric?: boolean }) {
  return <td className={cn('px-3 py-2 align-baseline', numeric && 'text-right tabular-nums whitespace-nowrap', className)} {...props} />;
}
