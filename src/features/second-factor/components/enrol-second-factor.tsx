import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { confirmSecondFactorBody, type ConfirmSecondFactorBody } from '@shared/schemas/second-factor';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { OneTimeCodeField } from '@/components/ui/one-time-code-field';
import { ConfirmationField } from '@/components/ui/confirmation-field';
import { useUser } from '@/lib/auth';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useBeginSecondFactor } from '../api/begin-second-factor';
import { useConfirmSecondFactor, type TurnedOn } from '../api/confirm-second-factor';

const FIELDS = ['code', 'currentPassword'] as const;

/** The secret in groups of four, as it is read aloud or typed from the screen; the app takes it with or without the spaces. */
const grouped = (secret: string) => secret.match(/.{1,4}/g)?.join(' ') ?? secret;

/**
 * Turning the second factor on: a new secret as a QR code for the
 * authenticator app and as text to type into it, then the code the app shows
 * to prove it holds the secret, with the password (so that a borrowed
 * session cannot enrol its own device). The recovery codes the server answers with go
 * to `onTurnedOn`, to be shown once.
 */
export function EnrolSecondFactor({ onTurnedOn }: { onTurnedOn: (turnedOn: TurnedOn) => void }) {
  const user = useUser();
  const begin = useBeginSecondFactor();
  const confirm = useConfirmSecondFactor();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof confirmSecondFactorBody>, unknown, ConfirmSecondFactorBody>({
    resolver: zodResolver(confirmSecondFactorBody, formParseOptions),
    defaultValues: { code: '', currentPassword: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit((body) =>
    send(async () => {
      onTurnedOn(await confirm.mutateAsync(body));
    }),
  );

  if (!begin.data) {
    return (
      <div className="space-y-3">
        <p className="max-w-prose text-sm text-ink-soft">
          With it on, signing in asks for your password and then a six-digit code from an authenticator app on your phone or computer
          (any app for time-based one-time passwords, RFC 6238). Site admin pages need it.
        </p>
        {begin.isError ? <Alert title="The second factor could not be set up.">{begin.error.message}</Alert> : null}
        <Button onClick={() => begin.mutate()} disabled={begin.isPending}>
          {begin.isPending ? 'Making a secret…' : 'Turn on the second factor'}
        </Button>
      </div>
    );
  }

  const { qrCode, secret } = begin.data;
  return (
    <div className="space-y-4">
      <ol className="max-w-prose list-decimal space-y-4 pl-5 text-sm">
        <li>
          <p>In your authenticator app, add an account by scanning this QR code.</p>
          <img src={qrCode} width={200} height={200} alt="QR code of your new Starledger secret, for an authenticator app to scan; the same secret is written out below." className="mt-2 rounded-sm border border-rule bg-white" />
        </li>
        <li>
          <p>Or type the secret into the app instead (a time-based key, 30 seconds, six digits):</p>
          <p className="mt-1 font-mono text-base tracking-wider break-all text-ink" data-testid="second-factor-secret">
            {grouped(secret)}
          </p>
        </li>
        <li>
          <p>Type the code the app now shows for Starledger, and your password.</p>
        </li>
      </ol>
      <form onSubmit={onSubmit} noValidate aria-label="Confirm the second factor" className="max-w-md space-y-3">
        {formError ? <Alert title="The second factor is not on yet.">{formError}</Alert> : null}
        <OneTimeCodeField hint="Six digits; a new one every 30 seconds." error={errors.code?.message} {...register('code')} />
        <ConfirmationField account={user.email} secondFactorOn={false} error={errors.currentPassword?.message} {...register('currentPassword')} />
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Checking…' : 'Turn it on'}
        </Button>
      </form>
    </div>
  );
}
