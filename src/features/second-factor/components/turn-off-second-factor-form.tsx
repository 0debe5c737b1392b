import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { turnOffSecondFactorBody, type TurnOffSecondFactorBody } from '@shared/schemas/second-factor';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PasswordField } from '@/components/ui/field';
import { OneTimeCodeField } from '@/components/ui/one-time-code-field';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useTurnOffSecondFactor } from '../api/turn-off-second-factor';

const FIELDS = ['currentPassword', 'code'] as const;

/** Turning the second factor off asks for both: the password and a code (or a recovery code). */
export function TurnOffSecondFactorForm({ account, onTurnedOff }: { account: string; onTurnedOff: (message: string) => void }) {
  const turnOff = useTurnOffSecondFactor();
  const [open, setOpen] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof turnOffSecondFactorBody>, unknown, TurnOffSecondFactorBody>({
    resolver: zodResolver(turnOffSecondFactorBody, formParseOptions),
    defaultValues: { currentPassword: '', code: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit((body) =>
    send(async () => {
      onTurnedOff((await turnOff.mutateAsync(body)).message);
    }),
  );

  if (!open) {
    return (
      <Button variant="danger" onClick={() => setOpen(true)}>
        Turn off the second factor…
      </Button>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Turn off the second factor" className="max-w-md space-y-4">
      <p className="text-sm text-ink-soft">Sign-in will ask for your password only, and site admin pages will be closed to you. Your recovery codes stop working.</p>
      {formError ? <Alert title="The second factor is still on.">{formError}</Alert> : null}
      <input type="email" name="username" autoComplete="username" value={account} readOnly hidden />
      <PasswordField label="Current password" autoComplete="current-password" error={errors.currentPassword?.message} {...register('currentPassword')} />
      <OneTimeCodeField recoveryToo hint="The six digits it shows now, or one of your recovery codes." error={errors.code?.message} {...register('code')} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" disabled={isSubmitting}>
          {isSubmitting ? 'Turning off…' : 'Turn it off'}
        </Button>
        <Button variant="secondary" disabled={isSubmitting} onClick={() => setOpen(false)}>
          Keep it on
        </Button>
      </div>
    </form>
  );
}
