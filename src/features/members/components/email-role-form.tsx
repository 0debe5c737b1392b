import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { addMemberBody, type AddMemberBody } from '@shared/schemas/projects';
import { projectRoles, roleLabels } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';

const FIELDS = ['email', 'role'] as const;

export interface EmailRoleFormProps {
  name: string;
  hint: string;
  submitLabel: string;
  pendingLabel: string;
  failedTitle: string;
  /** Sends the address and role; resolves to what to say once done. */
  send: (body: AddMemberBody) => Promise<string>;
}

/** An address and a role, as the lead astronomer gives them to add a member or to invite someone. */
export function EmailRoleForm({ name, hint, submitLabel, pendingLabel, failedTitle, send: sendBody }: EmailRoleFormProps) {
  const [done, setDone] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof addMemberBody>, unknown, AddMemberBody>({
    resolver: zodResolver(addMemberBody, formParseOptions),
    defaultValues: { email: '', role: 'observer' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (body) => {
    setDone(null);
    await send(async () => {
      setDone(await sendBody(body));
      reset({ email: '', role: body.role });
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label={name} className="space-y-4">
      {done ? <Alert kind="done" title={done} /> : null}
      {formError ? <Alert title={failedTitle}>{formError}</Alert> : null}
      <div className="flex flex-wrap items-start gap-4">
        <TextField label="E-mail" type="email" autoComplete="off" hint={hint} error={errors.email?.message} className="w-80 max-w-full" {...register('email')} />
        <SelectField label="Role" error={errors.role?.message} className="w-48" {...register('role')}>
          {projectRoles.map((r) => (
            <option key={r} value={r}>
              {roleLabels[r]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" className="mt-6" disabled={isSubmitting}>
          {isSubmitting ? pendingLabel : submitLabel}
        </Button>
      </div>
    </form>
  );
}
