import type { FormEventHandler } from 'react';
import { useForm, useWatch, type Control, type FieldErrors, type FieldValues, type UseFormRegister } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import {
  formatDeclination,
  formatRightAscension,
  parseDeclination,
  parseRightAscension,
  type CoordinateResult,
} from '@shared/coordinates';
import { createTargetBody, updateTargetBody, type CreateTargetBody, type Target, type UpdateTargetBody } from '@shared/schemas/targets';
import { LUMINOSITY_CLASSES, LUMINOSITY_CLASS_LABELS } from '@shared/physics/main-sequence';
import { ButtonLink, Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { Alert } from '@/components/ui/alert';
import { formatDegrees } from '@/lib/format';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useCreateTarget } from '../api/create-target';
import { useUpdateTarget } from '../api/update-target';

/*
 * Tags are typed as one comma-separated line; the shared schema's own rule
 * for a list of tags checks them after the split, so the form and the server
 * agree on what a valid tag is.
 */
const tagsText = z.string().transform((text, ctx) => {
  const list = [...new Set(text.split(',').map((t) => t.trim()).filter(Boolean))];
  const parsed = createTargetBody.shape.tags.safeParse(list);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const index = typeof issue.path[0] === 'number' ? issue.path[0] : undefined;
    ctx.addIssue({
      code: 'custom',
      message: index !== undefined ? `“${list[index]}”: ${issue.message}` : issue.code === 'too_big' ? 'Use at most 20 tags.' : issue.message,
    });
    return z.NEVER;
  }
  return parsed.data;
});

/*
 * Starledger prints negative declinations with a true minus sign (U+2212),
 * so text copied from a target sheet, or the edit form's own starting value,
 * carries one; the shared parser reads the ASCII hyphen.
 */
function asciiMinus(text: string): string {
  return text.replace(/\u2212/g, '-');
}

/** What the boxes hold: text, before the shared schemas read it. */
const targetFormText = z.object({
  designation: z.string(),
  ra: z.string().transform(asciiMinus),
  dec: z.string().transform(asciiMinus),
  notes: z.string(),
  tags: z.string(),
  assumedClass: z.string(),
});
type TargetFormValues = z.infer<typeof targetFormText>;

/** Reads the text with one of the shared schemas, keeping each problem on its field. */
function readWith<Out>(schema: z.ZodType<Out, unknown>) {
  return targetFormText.transform((text, ctx): Out => {
    const parsed = schema.safeParse(text);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', message: issue.message, path: issue.path });
    return z.NEVER;
  });
}

const createTargetForm = readWith(createTargetBody.extend({ tags: tagsText }));
const updateTargetForm = readWith(updateTargetBody.extend({ tags: tagsText }));

const FIELDS = ['designation', 'ra', 'dec', 'notes', 'tags', 'assumedClass'] as const;

function readBack(result: CoordinateResult, format: (deg: number) => string, unit: string): string | null {
  if (!result.ok) return null;
  return `Read as ${formatDegrees(result.degrees)} = ${format(result.degrees)} (${unit}).`;
}

/** Shows how the typed coordinate was understood, since "78.6" (degrees) and "05 14 32" (hours) look alike. */
function CoordinateHint<Out extends FieldValues>({ control, name }: { control: Control<TargetFormValues, unknown, Out>; name: 'ra' | 'dec' }) {
  const value = useWatch({ control, name });
  const general =
    name === 'ra'
      ? 'Sexagesimal hours (05 14 32.3, 05:14:32.3, 5h14m32.3s) or decimal degrees (78.6346).'
      : 'Sexagesimal degrees (−08 12 05, −08:12:05, −8d12m05s) or decimal degrees (−8.2014).';
  const readAs =
    value.trim() === ''
      ? null
      : name === 'ra'
        ? readBack(parseRightAscension(asciiMinus(value)), formatRightAscension, 'h m s')
        : readBack(parseDeclination(asciiMinus(value)), formatDeclination, '° ′ ″');
  return (
    <>
      {general}
      {readAs ? <span className="mt-0.5 block font-medium text-ink tabular-nums">{readAs}</span> : null}
    </>
  );
}

function TargetFields<Out extends FieldValues>({
  register,
  errors,
  control,
}: {
  register: UseFormRegister<TargetFormValues>;
  errors: FieldErrors<TargetFormValues>;
  control: Control<TargetFormValues, unknown, Out>;
}) {
  return (
    <>
      <TextField label="Designation" autoComplete="off" error={errors.designation?.message} {...register('designation')} className="max-w-md" />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label="Right ascension (J2000)"
          autoComplete="off"
          spellCheck={false}
          hint={<CoordinateHint control={control} name="ra" />}
          error={errors.ra?.message}
          {...register('ra')}
        />
        <TextField
          label="Declination (J2000)"
          autoComplete="off"
          spellCheck={false}
          hint={<CoordinateHint control={control} name="dec" />}
          error={errors.dec?.message}
          {...register('dec')}
        />
      </div>
      <TextAreaField label="Notes" rows={5} error={errors.notes?.message} {...register('notes')} />
      <TextField
        label="Tags"
        autoComplete="off"
        hint="Separate tags with commas, e.g. season-a, standard."
        error={errors.tags?.message}
        {...register('tags')}
      />
      <SelectField
        label="Assumed luminosity class (for the spectroscopic parallax)"
        hint="The luminosity for this class at the star’s temperature gives the photometric distance. Changing it re-derives this target’s photometric distance; the new values wait for the lead astronomer’s review."
        error={errors.assumedClass?.message}
        className="max-w-md"
        {...register('assumedClass')}
      >
        {LUMINOSITY_CLASSES.map((c) => (
          <option key={c} value={c}>
            {LUMINOSITY_CLASS_LABELS[c].replace(/^./, (ch) => ch.toUpperCase())}
          </option>
        ))}
      </SelectField>
    </>
  );
}

/** The boxes, the refusal above them and the buttons below, as both target forms show them. */
function TargetFormLayout<Out extends FieldValues>({
  label,
  onSubmit,
  formError,
  failedTitle,
  register,
  errors,
  control,
  isSubmitting,
  submitLabel,
  submittingLabel,
  cancelHref,
}: {
  label: string;
  onSubmit: FormEventHandler<HTMLFormElement>;
  formError: string | null;
  failedTitle: string;
  register: UseFormRegister<TargetFormValues>;
  errors: FieldErrors<TargetFormValues>;
  control: Control<TargetFormValues, unknown, Out>;
  isSubmitting: boolean;
  submitLabel: string;
  submittingLabel: string;
  cancelHref: string;
}) {
  return (
    <form onSubmit={onSubmit} noValidate aria-label={label} className="max-w-3xl space-y-5">
      {formError ? <Alert title={failedTitle}>{formError}</Alert> : null}
      <TargetFields register={register} errors={errors} control={control} />
      <div className="flex gap-3">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? submittingLabel : submitLabel}
        </Button>
        <ButtonLink to={cancelHref} variant="secondary">
          Cancel
        </ButtonLink>
      </div>
    </form>
  );
}

/** A new target. */
export function CreateTargetForm({
  projectId,
  cancelHref,
  onCreated,
}: {
  projectId: number;
  cancelHref: string;
  onCreated: (target: Target) => void;
}) {
  const createTarget = useCreateTarget(projectId);
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<TargetFormValues, unknown, CreateTargetBody>({
    resolver: zodResolver(createTargetForm, formParseOptions),
    defaultValues: { designation: '', ra: '', dec: '', notes: '', tags: '', assumedClass: 'main_sequence' },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit((body) =>
    send(async () => {
      onCreated(await createTarget.mutateAsync(body));
    }),
  );

  return (
    <TargetFormLayout
      label="New target"
      onSubmit={onSubmit}
      formError={formError}
      failedTitle="The target was not added."
      register={register}
      errors={errors}
      control={control}
      isSubmitting={isSubmitting}
      submitLabel="Add target"
      submittingLabel="Adding…"
      cancelHref={cancelHref}
    />
  );
}

/** Changes to an existing target. Only the fields that were changed are sent, so an untouched position keeps its full precision. */
export function EditTargetForm({
  projectId,
  target,
  cancelHref,
  onSaved,
}: {
  projectId: number;
  target: Target;
  cancelHref: string;
  onSaved: (target: Target) => void;
}) {
  const updateTarget = useUpdateTarget(projectId, target.id);
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting, dirtyFields },
  } = useForm<TargetFormValues, unknown, UpdateTargetBody>({
    resolver: zodResolver(updateTargetForm, formParseOptions),
    defaultValues: {
      designation: target.designation,
      ra: formatRightAscension(target.raDeg),
      dec: formatDeclination(target.decDeg),
      notes: target.notes,
      tags: target.tags.join(', '),
      assumedClass: target.assumedClass,
    },
  });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit((values) =>
    send(async () => {
      const body: UpdateTargetBody = {};
      for (const field of FIELDS) {
        if (dirtyFields[field]) Object.assign(body, { [field]: values[field] });
      }
      onSaved(Object.keys(body).length === 0 ? target : await updateTarget.mutateAsync(body));
    }),
  );

  return (
    <TargetFormLayout
      label={`Edit ${target.designation}`}
      onSubmit={onSubmit}
      formError={formError}
      failedTitle="The changes were not saved."
      register={register}
      errors={errors}
      control={control}
      isSubmitting={isSubmitting}
      submitLabel="Save changes"
      submittingLabel="Saving…"
      cancelHref={cancelHref}
    />
  );
}
