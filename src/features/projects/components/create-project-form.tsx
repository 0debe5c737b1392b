import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createProjectBody, type CreateProjectBody, type Project } from '@shared/schemas/projects';
import { paths } from '@/config/paths';
import { Button, linkClasses } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions, toOptionalText } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCreateProject } from '../api/create-project';
import { bindSiteFields, SITE_FIELD_PATHS, SiteFields } from './site-fields';

type FormInput = z.input<typeof createProjectBody>;

const FIELDS = ['name', 'code', 'description', ...SITE_FIELD_PATHS, 'leadEmail'] as const;

/** A site administrator opens a new observing programme and, optionally, names its lead astronomer. */
export function CreateProjectForm() {
  const createProject = useCreateProject();
  const [created, setCreated] = useState<Project | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<FormInput, unknown, CreateProjectBody>({
    resolver: zodResolver(createProjectBody, formParseOptions),
    defaultValues: { name: '', code: '', description: '', site: { name: '', timeZone: '' } },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (values) => {
    setCreated(null);
    await send(async () => {
      const project = await createProject.mutateAsync(values);
      setCreated(project);
      reset();
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="New project" className="space-y-4">
      {created ? (
        <Alert kind="done" title={`Project ${created.code} created.`}>
          {created.myRole ? (
            <Link to={paths.project.root.getHref(created.id)} className={linkClasses}>
              Open {created.name}
            </Link>
          ) : (
            'You are not a member of it, so it does not appear in your list.'
          )}
        </Alert>
      ) : null}
      {formError ? <Alert title="The project was not created.">{formError}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
        <TextField
          label="Code"
          autoComplete="off"
          hint="2–16 capital letters, digits or hyphens, e.g. NGT-26."
          error={errors.code?.message}
          {...register('code', { setValueAs: (v: string) => v.toUpperCase() })}
        />
      </div>
      <TextAreaField label="Description" rows={3} error={errors.description?.message} {...register('description')} />
      <SiteFields bind={bindSiteFields(register, errors.site)} />
      <TextField
        label="Lead astronomer’s e-mail"
        type="email"
        autoComplete="off"
        hint="Optional. The person with this account becomes the project’s lead astronomer."
        error={errors.leadEmail?.message}
        {...register('leadEmail', { setValueAs: toOptionalText })}
      />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Creating…' : 'Create project'}
      </Button>
    </form>
  );
}
