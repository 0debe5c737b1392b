import type { ReactNode } from 'react';
import { Button } from './button';

/**
 * The second question before an action that cannot be undone, asked where
 * the action's button was: what will happen, Yes, Keep, and the server's
 * words if it refused. It is a form, so that Enter in a field it holds
 * answers Yes.
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
  children,
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
  /** What the answer needs besides Yes, such as the password that confirms it (ConfirmationField); Enter in it answers Yes. */
  children?: ReactNode;
}) {
  return (
    <form
      role="group"
      aria-label={label}
      noValidate
      className="flex flex-wrap items-end gap-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        if (!busy) onYes();
      }}
    >
      <span className={children ? 'w-full' : undefined}>{question}</span>
      {children}
      <Button type="submit" variant="danger" size="sm" disabled={busy}>
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
    </form>
  );
}
