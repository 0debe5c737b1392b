import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { createProjectBody, type CreateProjectBody, type Project } from '@shared/schemas/projects';
import { paths } from '@/config/paths';
import { Button, linkClasses } from '@/components/ui/button';
import { FieldGroup, TextAreaField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions, toOptionalNumber, toOptionalText } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCreateProject } from '../api/create-project';

type FormInput = z.input<typeof createProjectBody>;

const FIELDS = [
  'name',
  'code',
  'description',
  'site',
  'site.name',
  'site.latitudeDeg',
  'site.longitudeDeg',
  'site.elevationM',
  'site.timeZone',
  'leadEmail',
] as const;

/** The site's numeric boxes: an empty one is "not given", not zero. */
const SITE_NUMBERS = [
  { name: 'latitudeDeg', label: 'Latitude (°)', hint: 'Decimal degrees, north positive.' },
  { name: 'longitudeDeg', label: 'Longitude (°)', hint: 'Decimal degrees, east positive.' },
  { name: 'elevationM', label: 'Elevation (m)', hint: 'Metres above sea level.' },
] as const;

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
      <FieldGroup legend="Site">
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField label="Site name" autoComplete="off" error={errors.site?.name?.message} {...register('site.name')} />
          <TextField
            label="Time zone"
            autoComplete="off"
            hint="IANA name, such as America/Santiago or Etc/UTC."
            error={errors.site?.timeZone?.message}
            {...register('site.timeZone')}
          />
          {SITE_NUMBERS.map(({ name, label, hint }) => (
            <TextField
              key={name}
              label={label}
              type="number"
              step="any"
              inputMode="decimal"
              hint={hint}
              error={errors.site?.[name]?.message}
              {...register(`site.${name}`, { setValueAs: toOptionalNumber })}
            />
          ))}
        </div>
      </FieldGroup>
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
