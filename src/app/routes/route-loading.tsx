import { StatusLine } from '@/components/ui/alert';

/** Shown while the first page's code arrives. */
export function RouteLoading() {
  return (
    <div className="mx-auto max-w-6xl px-6 py-10">
      <StatusLine>Opening the ledger…</StatusLine>
    </div>
  );
}
