import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { PASSWORD_HINT, samePassword, samePasswordIssue } from '@shared/schemas/auth';
import { newAccountFields } from '@shared/schemas/invitations';
import { Button } from '@/components/ui/button';
import { PasswordField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useAcceptInvitation } from '../api/accept-invitation';

const newAccountForm = newAccountFields.extend({ repeat: z.string() }).refine(samePassword, samePasswordIssue);
type NewAccountForm = z.infer<typeof newAccountForm>;
const FIELDS = ['name', 'password'] as const;

/** Accepting for an address without an account: the person names themselves and chooses a password. */
export function NewAccountForm({ token, email, onAccepted }: { token: string; email: string; onAccepted: (projectId: number) => void }) {
  const accept = useAcceptInvitation();
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof newAccountForm>, unknown, NewAccountForm>({
    resolver: zodResolver(newAccountForm, formParseOptions),
    defaultValues: { name: '', password: '', repeat: '' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);
  const name = useWatch({ control, name: 'name' });

  const onSubmit = handleSubmit(async ({ name, password }) => {
    await send(async () => onAccepted((await accept.mutateAsync({ token, name, password })).projectId));
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Accept the invitation" className="space-y-4">
      {formError ? <Alert title="The invitation was not accepted.">{formError}</Alert> : null}
      <TextField label="E-mail" type="email" autoComplete="username" value={email} readOnly hint="The invited address; it becomes your sign-in name." />
      <TextField label="Your name" autoComplete="name" hint="As your colleagues will see it in the trail." error={errors.name?.message} {...register('name')} />
      <PasswordField
        label="Password"
        autoComplete="new-password"
        hint={PASSWORD_HINT}
        strength={{ userInputs: [email, name] }}
        error={errors.password?.message}
        {...register('password')}
      />
      <PasswordField label="The same again" autoComplete="new-password" error={errors.repeat?.message} {...register('repeat')} />
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Creating your account…' : 'Create my account and join'}
      </Button>
    </form>
  );
}
