import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { addMemberBody, type AddMemberBody, type Member } from '@shared/schemas/projects';
import { projectRoles, roleLabels } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useAddMember } from '../api/add-member';

const FIELDS = ['email', 'role'] as const;

/** A lead astronomer adds someone who already has a Starledger account. */
export function AddMemberForm({ projectId, onAdded }: { projectId: number; onAdded?: (member: Member) => void }) {
  const addMember = useAddMember(projectId);
  const [added, setAdded] = useState<Member | null>(null);
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
    setAdded(null);
    await send(async () => {
      const member = await addMember.mutateAsync(body);
      setAdded(member);
      reset({ email: '', role: body.role });
      onAdded?.(member);
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Add member" className="space-y-4">
      {added ? <Alert kind="done" title={`${added.name} added as ${roleLabels[added.role]}.`} /> : null}
      {formError ? <Alert title="Nobody was added.">{formError}</Alert> : null}
      <div className="flex flex-wrap items-start gap-4">
        <TextField
          label="E-mail"
          type="email"
          autoComplete="off"
          hint="The person needs a Starledger account; a site administrator creates accounts."
          error={errors.email?.message}
          className="w-80"
          {...register('email')}
        />
        <SelectField label="Role" error={errors.role?.message} className="w-48" {...register('role')}>
          {projectRoles.map((r) => (
            <option key={r} value={r}>
              {roleLabels[r]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" className="mt-6" disabled={isSubmitting}>
          {isSubmitting ? 'Adding…' : 'Add member'}
        </Button>
      </div>
    </form>
  );
}
