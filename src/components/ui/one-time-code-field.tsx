import type { ComponentProps } from 'react';
import { TextField } from './field';

/**
 * The box for the six digits of an authenticator app: `one-time-code`, so
 * that a phone offers the code, and the numeric keyboard. `recoveryToo`
 * keeps the full keyboard, for a box that also takes a recovery code.
 */
export function OneTimeCodeField({
  hint,
  error,
  recoveryToo = false,
  ...input
}: { hint: string; error?: string; recoveryToo?: boolean } & Omit<ComponentProps<'input'>, 'type' | 'autoComplete' | 'inputMode'>) {
  return (
    <TextField
      label="Code from your authenticator app"
      autoComplete="one-time-code"
      inputMode={recoveryToo ? 'text' : 'numeric'}
      maxLength={recoveryToo ? 40 : 7}
      spellCheck={false}
      hint={hint}
      error={error}
      {...input}
    />
  );
}
