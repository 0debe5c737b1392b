import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { summarySchedule, weekdayNames, type SummarySchedule, type SummarySettings } from '@shared/schemas/mail';
import { Alert, StatusLine } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { CheckboxField, SelectField, TextField } from '@/components/ui/field';
import { formParseOptions } from '@/lib/form-errors';
import { useServerErrors } from '@/hooks/use-server-errors';
import { useUpdateSummarySchedule } from '../api/update-summary-schedule';

const FIELDS = ['enabled', 'weekday', 'time'] as const;

/** When the weekly summary goes out: on or off, the weekday and the local time in the site's time zone. */
export function SummaryScheduleForm({ projectId, settings }: { projectId: number; settings: SummarySettings }) {
  const update = useUpdateSummarySchedule(projectId);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting, isSubmitSuccessful },
  } = useForm<SummarySchedule>({ resolver: zodResolver(summarySchedule, formParseOptions), defaultValues: settings.schedule });
  const { formError, send } = useServerErrors(setError, FIELDS);

  const onSubmit = handleSubmit((body) =>
    send(async () => {
      await update.mutateAsync(body);
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Summary schedule" className="space-y-4">
      {formError ? <Alert title="The schedule was not changed.">{formError}</Alert> : null}
      <CheckboxField label="Send the weekly summary" error={errors.enabled?.message} {...register('enabled')} />
      <div className="flex flex-wrap items-start gap-4">
        <SelectField label="Weekday" error={errors.weekday?.message} className="w-48" {...register('weekday', { valueAsNumber: true })}>
          {weekdayNames.map((name, i) => (
            <option key={name} value={i + 1}>
              {name}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Time"
          type="time"
          hint={`Local time at the site (${settings.timeZone}).`}
          error={errors.time?.message}
          className="w-56"
          {...register('time')}
        />
      </div>
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? 'Saving…' : 'Save schedule'}
        </Button>
        {isSubmitSuccessful && !formError ? <StatusLine>Schedule saved.</StatusLine> : null}
      </div>
    </form>
  );
}
