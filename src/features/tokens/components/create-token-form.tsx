import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createTokenBody, DEFAULT_TOKEN_LIFETIME_DAYS, TOKEN_LIFETIMES_DAYS, type CreateTokenBody } from '@shared/schemas/tokens';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ConfirmationField } from '@/components/ui/confirmation-field';
import { useUser } from '@/lib/auth';
import { confirmationBody } from '@/lib/confirmation';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCreateToken, type CreatedToken } from '../api/create-token';

const FIELDS = ['name', 'lifetimeDays', 'currentPassword', 'code'] as const;

/**
 * Names a new token after what will use it and chooses how long it lasts,
 * confirmed with the password or a code (a token acts as its owner); the
 * token itself is handed to `onCreated` to be shown once.
 */
export function CreateTokenForm({ onCreated }: { onCreated: (created: CreatedToken) => void }) {
  const user = useUser();
  const createToken = useCreateToken();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof createTokenBody>, unknown, CreateTokenBody>({
    resolver: zodResolver(createTokenBody, formParseOptions),
    defaultValues: { name: '', lifetimeDays: DEFAULT_TOKEN_LIFETIME_DAYS, currentPassword: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(({ currentPassword, code: _code, ...body }) =>
    send(async () => {
      const created = await createToken.mutateAsync({ ...body, ...confirmationBody(currentPassword, user.secondFactor) });
      reset({ name: '', lifetimeDays: DEFAULT_TOKEN_LIFETIME_DAYS, currentPassword: '' });
      onCreated(created);
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Create a token" className="space-y-3">
      {formError ? <Alert title="No token was created.">{formError}</Alert> : null}
      <div className="flex flex-wrap items-start gap-4">
        <TextField
          label="Token name"
          autoComplete="off"
          hint="Say what will use it, e.g. “dome pipeline” or “reduction laptop”."
          error={errors.name?.message}
          className="w-80"
          {...register('name')}
        />
        <SelectField
          label="Expires after"
          hint="Then it stops working; make a new one."
          error={errors.lifetimeDays?.message}
          className="w-44"
          {...register('lifetimeDays', { valueAsNumber: true })}
        >
          {TOKEN_LIFETIMES_DAYS.map((days) => (
            <option key={days} value={days}>
              {days === 365 ? '1 year' : `${days} days`}
            </option>
          ))}
        </SelectField>
        <ConfirmationField
          account={user.email}
          secondFactorOn={user.secondFactor}
          error={errors.currentPassword?.message ?? errors.code?.message}
          className="w-80"
          {...register('currentPassword')}
        />
        <Button type="submit" className="mt-6" disabled={isSubmitting}>
          {isSubmitting ? 'Creating…' : 'Create token'}
        </Button>
      </div>
    </form>
  );
}
