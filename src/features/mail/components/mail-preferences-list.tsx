import type { MailPreference } from '@shared/schemas/mail';
import { roleLabels, type ProjectRole } from '@shared/schemas/roles';
import { Alert } from '@/components/ui/alert';
import { CheckboxField } from '@/components/ui/field';
import { useUpdateMailPreference } from '../api/update-mail-preference';

/** Each project of the person's with its two choices, saved as soon as a box changes. */
export function MailPreferencesList({ preferences }: { preferences: MailPreference[] }) {
  const update = useUpdateMailPreference();
  return (
    <div className="space-y-4">
      <div aria-live="polite">{update.isError ? <Alert title="That choice was not saved.">{update.error.message}</Alert> : null}</div>
      <ul className="divide-y divide-rule border-y border-rule">
        {preferences.map((p) => (
          <li key={p.projectId} className="py-4" data-testid={`mail-preference-${p.projectCode}`}>
            <h3 className="font-serif text-lg font-semibold">
              {p.projectName} <span className="text-sm font-normal text-ink-soft">· {roleLabels[p.role as ProjectRole] ?? p.role}</span>
            </h3>
            <div className="mt-2 space-y-2">
              <CheckboxField
                label="The weekly summary of this project"
                hint={p.summaryAlways ? 'As a PI of this project you always receive it.' : 'Uploads, decisions, what awaits review and new warnings, once a week.'}
                checked={p.weeklySummary}
                disabled={p.summaryAlways}
                onChange={(e) => update.mutate({ projectId: p.projectId, body: { weeklySummary: e.currentTarget.checked } })}
              />
              <CheckboxField
                label="Mail me when values I proposed are approved or rejected"
                checked={p.reviewNotice}
                onChange={(e) => update.mutate({ projectId: p.projectId, body: { reviewNotice: e.currentTarget.checked } })}
              />
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}
