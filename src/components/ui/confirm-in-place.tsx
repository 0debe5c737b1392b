import type { ReactNode } from 'react';
import { Button } from './button';

/**
 * The second question before an action that cannot be undone, asked where
 * the action's button was: what will happen, Yes, Keep, and the server's
 * words if it refused.
 */
export function ConfirmInPlace({
  label,
  question,
  yes,
  busy,
  busyText,
  keep = 'Keep it',
  error,
  onYes,
  onKeep,
}: {
  /** The group's accessible name, e.g. "Confirm ending the session of Firefox 133 on Linux". */
  label: string;
  question: ReactNode;
  yes: string;
  busy: boolean;
  busyText: string;
  keep?: string;
  error: string | null;
  onYes: () => void;
  onKeep: () => void;
}) {
  return (
    <div role="group" aria-label={label} className="flex flex-wrap items-center gap-2 text-sm">
      <span>{question}</span>
      <Button variant="danger" size="sm" disabled={busy} onClick={onYes}>
        {busy ? busyText : yes}
      </Button>
      <Button variant="secondary" size="sm" disabled={busy} onClick={onKeep}>
        {keep}
      </Button>
      {error ? (
        <p role="alert" className="w-full">
          <span className="font-semibold text-alert">Error:</span> {error}
        </p>
      ) : null}
    </div>
  );
}
