import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { loginBody, type LoginBody } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { PasswordField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { codeAsked, useLogin } from '@/lib/auth';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { SignInCodeForm } from './sign-in-code-form';

const FIELDS = ['email', 'password'] as const;

/**
 * E-mail and password; the server's own words when they are refused (wrong
 * password, too many attempts). For an account with the second factor on,
 * a right password leads to the code step (SignInCodeForm).
 */
export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const login = useLogin();
  const [asked, setAsked] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    resetField,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof loginBody>, unknown, LoginBody>({
    resolver: zodResolver(loginBody, formParseOptions),
    defaultValues: { email: '', password: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (body) => {
    const signedIn = await send(async () => {
      const answer = await login.mutateAsync(body);
      if (codeAsked(answer)) setAsked(answer.message);
      else onSignedIn();
    });
    if (!signedIn) {
      resetField('password');
      setFocus('password');
    }
  });

  if (asked !== null) {
    return (
      <SignInCodeForm
        asked={asked}
        onSignedIn={onSignedIn}
        onStartAgain={() => {
          setAsked(null);
          resetField('password');
        }}
      />
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign in" className="space-y-4">
      {formError ? <Alert title={formError} /> : null}
      <TextField label="E-mail" type="email" autoComplete="username" error={errors.email?.message} {...register('email')} />
      <PasswordField
        label="Password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
