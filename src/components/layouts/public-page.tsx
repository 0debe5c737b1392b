import type { ReactNode } from 'react';
import { cn } from '@/lib/cn';
import { Wordmark } from './wordmark';
import { DimToggle, ThemeToggle } from './theme-toggle';

/**
 * The narrow page for what comes before the workbook: signing in, accepting
 * an invitation, setting a new password; `wide` for a page of reading (the
 * privacy notice), at a comfortable line length.
 */
export function PublicPage({ title, subtitle, wide = false, children }: { title: string; subtitle?: ReactNode; wide?: boolean; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col bg-paper text-ink">
      <title>{`${title} · Starledger`}</title>
      <div className="flex justify-end gap-3 px-6 py-4">
        <ThemeToggle />
        <DimToggle />
      </div>
      <main className={cn('mx-auto w-full flex-1 px-6 pt-10 pb-16', wide ? 'max-w-2xl' : 'max-w-sm')}>
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
