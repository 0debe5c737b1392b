import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createUserBody, PASSWORD_HINT, type CreateUserBody, type User } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { CheckboxField, PasswordField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { ConfirmationField } from '@/components/ui/confirmation-field';
import { useUser } from '@/lib/auth';
import { confirmationBody } from '@/lib/confirmation';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCreateUser } from '../api/create-user';

const FIELDS = ['email', 'name', 'password', 'isSiteAdmin', 'currentPassword', 'code'] as const;

/**
 * A site administrator opens an account with a first password, to be passed
 * on to its owner by a channel of the team's choosing, confirmed with the
 * administrator's own password or a code.
 */
export function CreateUserForm() {
  const admin = useUser();
  const createUser = useCreateUser();
  const [created, setCreated] = useState<User | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    control,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof createUserBody>, unknown, CreateUserBody>({
    resolver: zodResolver(createUserBody, formParseOptions),
    defaultValues: { email: '', name: '', password: '', isSiteAdmin: false, currentPassword: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);
  const [email, name] = useWatch({ control, name: ['email', 'name'] });

  const onSubmit = handleSubmit(async ({ currentPassword, code: _code, ...body }) => {
    setCreated(null);
    await send(async () => {
      setCreated(await createUser.mutateAsync({ ...body, ...confirmationBody(currentPassword, admin.secondFactor) }));
      reset();
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="New account" className="max-w-xl space-y-4">
      {created ? <Alert kind="done" title={`Account for ${created.name} (${created.email}) created.`} /> : null}
      {formError ? <Alert title="The account was not created.">{formError}</Alert> : null}
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
      <PasswordField
        label="First password"
        autoComplete="new-password"
        hint={PASSWORD_HINT}
        strength={{ userInputs: [email, name] }}
        error={errors.password?.message}
        {...register('password')}
      />
      <CheckboxField
        label="Site administrator"
        hint="Can create projects and manage every account."
        error={errors.isSiteAdmin?.message}
        {...register('isSiteAdmin')}
      />
      <ConfirmationField
        account={admin.email}
        secondFactorOn={admin.secondFactor}
        error={errors.currentPassword?.message ?? errors.code?.message}
        {...register('currentPassword')}
      />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Creating…' : 'Create account'}
      </Button>
    </form>
  );
}
