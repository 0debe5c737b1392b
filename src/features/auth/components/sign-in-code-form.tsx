import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { signInCodeBody, type SignInCodeBody } from '@shared/schemas/second-factor';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { OneTimeCodeField } from '@/components/ui/one-time-code-field';
import { isApiError } from '@/lib/api-client';
import { useLoginCode } from '@/lib/auth';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';

const FIELDS = ['code'] as const;

/**
 * The sign-in's second step, after a correct password of an account with the
 * second factor on: the six digits of the authenticator app, or (switched to)
 * one of the recovery codes. A wrong or used code is named at the field; too
 * many wrong ones, and the wait, come back as the server's words over the
 * form; a password that waited too long starts the sign-in again.
 */
export function SignInCodeForm({ asked, onSignedIn, onStartAgain }: { asked: string; onSignedIn: () => void; onStartAgain: () => void }) {
  const loginCode = useLoginCode();
  const [recovery, setRecovery] = useState(false);
  const [expired, setExpired] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    resetField,
    clearErrors,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof signInCodeBody>, unknown, SignInCodeBody>({
    resolver: zodResolver(signInCodeBody, formParseOptions),
    defaultValues: { code: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (body) => {
    const signedIn = await send(async () => {
      try {
        await loginCode.mutateAsync(body);
      } catch (error) {
        if (isApiError(error) && error.status === 401) setExpired(true);
        throw error;
      }
      onSignedIn();
    });
    if (!signedIn) setFocus('code');
  });

  const switchKind = () => {
    setRecovery((r) => !r);
    resetField('code');
    clearErrors();
    setTimeout(() => setFocus('code'));
  };

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign-in code" className="space-y-4">
      {formError ? (
        <Alert title={formError}>
          {expired ? (
            <Button variant="secondary" size="sm" className="mt-2" onClick={onStartAgain}>
              Start again with your password
            </Button>
          ) : null}
        </Alert>
      ) : (
        <Alert kind="notice" title="Your password is right.">
          {asked}
        </Alert>
      )}
      {recovery ? (
        <TextField
          key="recovery"
          label="Recovery code"
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          hint="One of the ten codes you saved when you turned the second factor on, such as ABCDE-FGH23. Each works once."
          error={errors.code?.message}
          {...register('code')}
        />
      ) : (
        <OneTimeCodeField key="code" hint="The six digits it shows now for Starledger." error={errors.code?.message} {...register('code')} />
      )}
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Checking…' : 'Sign in'}
      </Button>
      <div className="flex flex-wrap justify-between gap-2">
        <Button variant="quiet" size="sm" onClick={switchKind}>
          {recovery ? 'Use the authenticator app instead' : 'Use a recovery code instead'}
        </Button>
        <Button variant="quiet" size="sm" onClick={onStartAgain}>
          Sign in as someone else
        </Button>
      </div>
    </form>
  );
}
