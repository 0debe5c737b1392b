import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { updateProjectBody, type Project, type UpdateProjectBody } from '@shared/schemas/projects';
import { Button } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formParseOptions, toOptionalNumber } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useUpdateProject } from '../api/update-project';
import { bindSiteFields, SITE_FIELD_PATHS, SiteFields } from './site-fields';

type FormInput = z.input<typeof updateProjectBody>;

/*
 * The shared schema makes every setting optional (a PATCH sends what
 * changed); on this page every box is shown filled in, so an emptied R_V box
 * is a mistake to point out rather than "leave unchanged".
 */
const settingsForm = updateProjectBody.superRefine((values, ctx) => {
  if (values.rV === undefined) ctx.addIssue({ code: 'custom', path: ['rV'], message: 'Enter a value, such as 3.1.' });
});

const FIELDS = ['name', 'description', ...SITE_FIELD_PATHS, 'rV'] as const;

const formValuesOf = (project: Project): FormInput => ({
  name: project.name,
  description: project.description,
  site: { ...project.site },
  rV: project.rV,
});

/**
 * The lead astronomer's settings for a project. Only what was changed is
 * sent, so saving a new description does not re-derive anything; a changed
 * R_V re-derives every target on the server, in the same transaction.
 */
export function ProjectSettingsForm({ project, onSaved }: { project: Project; onSaved?: (project: Project, rederived: boolean) => void }) {
  const updateProject = useUpdateProject(project.id);
  const [saved, setSaved] = useState<'unchanged' | 'saved' | 'rederived' | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting, dirtyFields },
  } = useForm<FormInput, unknown, UpdateProjectBody>({
    resolver: zodResolver(settingsForm, formParseOptions),
    defaultValues: formValuesOf(project),
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit(async (values) => {
    setSaved(null);
    const body: UpdateProjectBody = {};
    if (dirtyFields.name) body.name = values.name;
    if (dirtyFields.description) body.description = values.description;
    // The site is one setting: any changed box sends the whole site.
    if (dirtyFields.site && Object.values(dirtyFields.site).some(Boolean)) body.site = values.site;
    if (dirtyFields.rV && values.rV !== project.rV) body.rV = values.rV;
    if (Object.keys(body).length === 0) {
      setSaved('unchanged');
      return;
    }
    await send(async () => {
      const updated = await updateProject.mutateAsync(body);
      reset(formValuesOf(updated));
      setSaved(body.rV !== undefined ? 'rederived' : 'saved');
      onSaved?.(updated, body.rV !== undefined);
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Project settings" className="max-w-3xl space-y-5">
      {saved === 'unchanged' ? <Alert kind="notice" title="Nothing was changed." /> : null}
      {saved === 'saved' ? <Alert kind="done" title="Settings saved." /> : null}
      {saved === 'rederived' ? (
        <Alert kind="done" title="Settings saved; every target was re-derived.">
          The targets were re-derived with the new R<sub>V</sub>; values that changed are proposed and await review.
        </Alert>
      ) : null}
      {formError ? <Alert title="The settings were not saved.">{formError}</Alert> : null}
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <TextAreaField label="Description" rows={4} error={errors.description?.message} {...register('description')} />
      <SiteFields bind={bindSiteFields(register, errors.site)} />
      <TextField
        label={
          <>
            Ratio of total to selective extinction, R<sub>V</sub>
          </>
        }
        type="number"
        step="0.1"
        inputMode="decimal"
        className="max-w-xl"
        hint={
          <>
            A<sub>V</sub> = R<sub>V</sub> E(B−V). 3.1 for the diffuse interstellar medium (Cardelli, Clayton &amp; Mathis 1989); between 2
            and 6. A change re-derives every target’s extinction-dependent values, and the new values await review.
          </>
        }
        error={errors.rV?.message}
        {...register('rV', { setValueAs: toOptionalNumber })}
      />
      <Button type="submit" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : 'Save settings'}
      </Button>
    </form>
  );
}
