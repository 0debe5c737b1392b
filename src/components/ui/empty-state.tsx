import type { ReactNode } from 'react';

/** What a page shows when its list has nothing in it yet, with the next step if there is one. */
export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-sm border border-dashed border-rule px-6 py-10 text-center">
      <p className="font-serif text-lg font-semibold text-ink">{title}</p>
      {children ? <div className="mx-auto mt-2 max-w-prose text-sm text-ink-soft">{children}</div> : null}
      {action ? <div className="mt-4 flex justify-center">{action}</div> : null}
    </div>
  );
}
