import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';

/**
 * A message box that names its kind in words ("Error", "Done") so it never
 * relies on colour alone.
 */
export function Alert({
  kind = 'error',
  title,
  children,
  className,
}: {
  kind?: 'error' | 'caution' | 'notice' | 'done';
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
}) {
  const word = { error: 'Error', caution: 'Caution', done: 'Done', notice: 'Note' }[kind];
  const urgent = kind === 'error' || kind === 'caution';
  return (
    <div
      role={urgent ? 'alert' : 'status'}
      className={cn(
        'rounded-sm border-l-4 bg-paper-deep px-4 py-3 text-sm',
        urgent ? 'border-alert' : kind === 'done' ? 'border-good' : 'border-brass',
        className,
      )}
    >
      <p className="font-semibold">
        <span className={urgent ? 'text-alert' : kind === 'done' ? 'text-good' : 'text-brass-deep'}>{word}:</span>{' '}
        {title}
      </p>
      {children ? <div className="mt-1 text-ink">{children}</div> : null}
    </div>
  );
}

/** A quiet line for "loading…" and similar transient states, read out by screen readers. */
export function StatusLine({ children, className }: { children: ReactNode; className?: string }) {
  return (
    <p role="status" className={cn('py-6 text-sm text-ink-soft italic', className)}>
      {children}
    </p>
  );
}
