import type { ReactNode } from 'react';
import { Wordmark } from './wordmark';
import { DimToggle, ThemeToggle } from './theme-toggle';

/** The narrow page for what comes before the workbook: signing in, accepting an invitation, setting a new password. */
export function PublicPage({ title, subtitle, children }: { title: string; subtitle?: ReactNode; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col bg-paper text-ink">
      <title>{`${title} · Starledger`}</title>
      <div className="flex justify-end gap-3 px-6 py-4">
        <ThemeToggle />
        <DimToggle />
      </div>
      <main className="mx-auto w-full max-w-sm flex-1 px-6 pt-10 pb-16">
        <div className="mb-8 border-b-4 border-double border-rule pb-4 text-center">
          <Wordmark className="justify-center" />
          <h1 className="mt-4 text-2xl font-semibold">{title}</h1>
          {subtitle ? <p className="mt-1 text-sm text-ink-soft">{subtitle}</p> : null}
        </div>
        {children}
      </main>
    </div>
  );
}
