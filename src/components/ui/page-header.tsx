import type { ReactNode } from 'react';

/**
 * The head of a ledger page: an optional line above the title (a project's
 * code, say), the title in the serif, a description, and the page's actions.
 * The double rule underneath is the ledger's page head.
 */
export function PageHeader({
  title,
  eyebrow,
  description,
  actions,
}: {
  title: ReactNode;
  eyebrow?: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b-4 border-double border-rule pb-4">
      <div className="min-w-0">
        {eyebrow ? <p className="mb-1 text-xs font-semibold tracking-[0.18em] text-brass-deep uppercase">{eyebrow}</p> : null}
        <h1 className="text-3xl leading-tight font-semibold text-ink">{title}</h1>
        {description ? <div className="mt-2 max-w-3xl text-sm text-ink-soft">{description}</div> : null}
      </div>
      {actions ? <div className="flex flex-wrap items-center gap-2" data-print="hide">{actions}</div> : null}
    </header>
  );
}

/** A titled section of a page, with a single rule under its heading. */
export function Section({
  title,
  actions,
  children,
  className,
}: {
  title: ReactNode;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <section className={className}>
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-3 border-b border-rule pb-1">
        <h2 className="text-xl font-semibold text-ink">{title}</h2>
        {actions ? <div className="flex items-center gap-2" data-print="hide">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
