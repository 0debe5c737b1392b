import type { UploadProgress } from '@shared/schemas/uploads';

const number = (n: number) => new Intl.NumberFormat('en-GB').format(n);

/** The commit's step in words: what has been written and derived so far. */
export function progressWords(p: UploadProgress | null | undefined): string {
  if (!p || p.phase === 'queued') return 'Waiting for the commit to start…';
  if (p.phase === 'reading') return 'Reading the preview…';
  if (p.phase === 'writing') return `Writing measurements: ${number(p.rowsWritten)} of ${number(p.rowsTotal)}`;
  if (p.phase === 'deriving') return `Deriving values: ${number(p.targetsDerived)} of ${number(p.targetsTotal)} targets (${number(p.rowsWritten)} measurements written)`;
  if (p.phase === 'done') return 'Finishing…';
  return 'The commit stopped; nothing was imported.';
}

/** How far the commit is, as a fraction of its work (writing the rows is taken as a third, deriving as the rest). */
function fraction(p: UploadProgress | null | undefined): number | null {
  if (!p) return null;
  if (p.phase === 'writing') return p.rowsTotal ? (p.rowsWritten / p.rowsTotal) / 3 : 0;
  if (p.phase === 'deriving') return 1 / 3 + (p.targetsTotal ? (2 / 3) * (p.targetsDerived / p.targetsTotal) : 0);
  if (p.phase === 'done') return 1;
  return null;
}

/**
 * The commit's progress while it runs, from the server's own counts (rows
 * written, targets derived), with the words in a polite live region so a
 * screen reader hears each step without losing its place.
 */
export function CommitProgress({ progress }: { progress: UploadProgress | null | undefined }) {
  const f = fraction(progress);
  return (
    <div className="max-w-prose space-y-1" data-testid="commit-progress">
      {/* Track and bar drawn in theme tokens (the browser's own grey would break the night theme's red-only light). */}
      <progress
        className="block h-2 w-full appearance-none overflow-hidden rounded-sm border border-rule bg-paper-deep [&::-moz-progress-bar]:bg-brass [&::-webkit-progress-bar]:bg-paper-deep [&::-webkit-progress-value]:bg-brass"
        aria-label="Commit progress"
        max={1}
        {...(f === null ? {} : { value: f })}
      />
      <p className="text-sm text-ink" role="status" aria-live="polite">
        {progressWords(progress)}
      </p>
    </div>
  );
}
