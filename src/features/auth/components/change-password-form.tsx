import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { changePasswordForm, PASSWORD_HINT, type ChangePasswordForm } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { PasswordField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useChangePassword } from '../api/change-password';

const FIELDS = ['currentPassword', 'password'] as const;

/** The current password, then the new one typed twice; the account name goes along (hidden) for password managers. */
export function ChangePasswordForm({ email }: { email: string }) {
  const change = useChangePassword();
  const [done, setDone] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof changePasswordForm>, unknown, ChangePasswordForm>({
    resolver: zodResolver(changePasswordForm, formParseOptions),
    defaultValues: { currentPassword: '', password: '', repeat: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async ({ currentPassword, password }) => {
    setDone(null);
    await send(async () => {
      setDone((await change.mutateAsync({ currentPassword, password })).message);
      reset();
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Change your password" className="max-w-md space-y-4">
      {formError ? <Alert title="The password was not changed.">{formError}</Alert> : null}
      {done ? <Alert kind="done" title={done} /> : null}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <PasswordField label="Current password" autoComplete="current-password" error={errors.currentPassword?.message} {...register('currentPassword')} />
      <PasswordField
        label="New password"
        autoComplete="new-password"
        hint={PASSWORD_HINT}
        strength={{ userInputs: [email] }}
        error={errors.password?.message}
        {...register('password')}
      />
      <PasswordField label="The new password again" autoComplete="new-password" error={errors.repeat?.message} {...register('repeat')} />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : 'Change the password'}
      </Button>
    </form>
  );
}
