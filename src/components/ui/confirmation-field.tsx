import type { ComponentProps } from 'react';
import { PasswordField } from './field';

/**
 * The box a sensitive change (a new API token, a new account) is confirmed
 * with: the current password, or with the second factor on a current code
 * (src/lib/confirmation.ts says which was typed). The account's e-mail goes
 * along, hidden, so that a password manager offers the right password.
 */
export function ConfirmationField({
  account,
  secondFactorOn,
  error,
  className,
  ...input
}: { account: string; secondFactorOn: boolean; error?: string; className?: string } & Omit<ComponentProps<'input'>, 'type'>) {
  return (
    <>
      <input type="email" name="username" autoComplete="username" value={account} readOnly hidden />
      <PasswordField
        label={secondFactorOn ? 'Confirm with your password (or a code)' : 'Confirm with your password'}
        autoComplete="current-password"
        hint={secondFactorOn ? 'Your current password, or the six digits your authenticator app shows now.' : 'Your own current password, asked again for this change.'}
        error={error}
        className={className}
        {...input}
      />
    </>
  );
}
