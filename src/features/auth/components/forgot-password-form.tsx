import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { passwordResetRequestBody, type PasswordResetRequestBody } from '@shared/schemas/auth';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useRequestPasswordReset } from '../api/request-password-reset';

const FIELDS = ['email'] as const;

/** Asks for a reset link. The answer is the same whether or not an account has the address, so the page says no more than the server does. */
export function ForgotPasswordForm() {
  const requestReset = useRequestPasswordReset();
  const [answer, setAnswer] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof passwordResetRequestBody>, unknown, PasswordResetRequestBody>({
    resolver: zodResolver(passwordResetRequestBody, formParseOptions),
    defaultValues: { email: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (body) => {
    setAnswer(null);
    await send(async () => setAnswer((await requestReset.mutateAsync(body)).message));
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Ask for a reset link" className="space-y-4">
      {answer ? <Alert kind="done" title="Request received.">{answer}</Alert> : null}
      {formError ? <Alert title={formError} /> : null}
      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        hint="The address your Starledger account is under."
        error={errors.email?.message}
        {...register('email')}
      />
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Sending…' : 'Send me a link'}
      </Button>
    </form>
  );
}
