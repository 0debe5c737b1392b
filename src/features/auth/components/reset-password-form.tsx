import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { choosePasswordForm, PASSWORD_HINT, type ChoosePasswordForm } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { PasswordField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCompletePasswordReset } from '../api/complete-password-reset';

const FIELDS = ['password'] as const;

/** The new password, typed twice; the account name goes along (hidden) so that a password manager files it under the right account. */
export function ResetPasswordForm({ token, email, onDone }: { token: string; email: string; onDone: (message: string) => void }) {
  const complete = useCompletePasswordReset();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof choosePasswordForm>, unknown, ChoosePasswordForm>({
    resolver: zodResolver(choosePasswordForm, formParseOptions),
    defaultValues: { password: '', repeat: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async ({ password }) => {
    await send(async () => onDone((await complete.mutateAsync({ token, password })).message));
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Set a new password" className="space-y-4">
      {formError ? <Alert title="The password was not changed.">{formError}</Alert> : null}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <PasswordField
        label="New password"
        autoComplete="new-password"
        hint={PASSWORD_HINT}
        strength={{ userInputs: [email] }}
        error={errors.password?.message}
        {...register('password')}
      />
      <PasswordField label="The same again" autoComplete="new-password" error={errors.repeat?.message} {...register('repeat')} />
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : 'Set the new password'}
      </Button>
    </form>
  );
}
