import { roleCan } from '@shared/schemas/roles';
import { useNumericParam } from '@/hooks/use-numeric-param';
import { PageHeader, Section } from '@/components/ui/page-header';
import { Alert, StatusLine } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { DetailItem, DetailList } from '@/components/ui/detail-list';
import { ForbiddenMessage, NotFoundMessage } from '@/components/errors/error-messages';
import { QueryError } from '@/components/errors/query-error';
import { useProject } from '@/features/projects/api/get-project';
import { useSummarySettings } from '@/features/mail/api/get-summary-settings';
import { useSummaryPreview } from '@/features/mail/api/get-summary-preview';
import { useSendSummary } from '@/features/mail/api/send-summary';
import { SummaryScheduleForm } from '@/features/mail/components/summary-schedule-form';
import { MailView } from '@/features/mail/components/mail-view';
import type { SendSummaryResult, SummarySettings } from '@shared/schemas/mail';

const when = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false }).format(new Date(iso));

function sentWords(result: SendSummaryResult): string {
  if (result.queued === 0) return `Everyone already has the summary for ${result.week}; a week’s summary goes out once.`;
  const others = result.alreadyQueued > 0 ? ` (${result.alreadyQueued} already had it)` : '';
  return `The summary for ${result.week} is on its way to ${result.queued === 1 ? '1 person' : `${result.queued} people`}${others}.`;
}

function SendNow({ projectId, settings }: { projectId: number; settings: SummarySettings }) {
  const send = useSendSummary(projectId);
  return (
    <div className="space-y-3">
      <p className="max-w-prose text-sm text-ink-soft">
        Sends this week’s ({settings.week}) summary now to everyone listed who has not had it yet. Each person receives one summary a week, so the scheduled
        one is not sent again afterwards.
        {settings.weekQueuedAt ? ` This week’s was sent on ${when(settings.weekQueuedAt, settings.timeZone)}.` : ''}
      </p>
      <Button variant="secondary" onClick={() => send.mutate()} disabled={send.isPending || settings.recipients.length === 0}>
        {send.isPending ? 'Sending…' : 'Send now'}
      </Button>
      <div aria-live="polite">
        {send.isSuccess ? <StatusLine>{sentWords(send.data)}</StatusLine> : null}
        {send.isError ? <Alert title="The summary was not sent.">{send.error.message}</Alert> : null}
      </div>
    </div>
  );
}

function SummaryPage({ projectId }: { projectId: number }) {
  const project = useProject(projectId);
  const allowed = project.data ? roleCan(project.data.myRole, 'manageSummary') : false;
  const settings = useSummarySettings(projectId);
  const preview = useSummaryPreview(projectId);

  if (project.isPending) return <StatusLine>Loading the project…</StatusLine>;
  if (project.isError) return <QueryError what="The project" error={project.error} onRetry={() => void project.refetch()} />;
  if (!allowed) return <ForbiddenMessage detail="The weekly summary is kept by the project’s PI and lead astronomer." />;

  return (
    <>
      <title>{`Weekly summary · ${project.data.code} · Starledger`}</title>
      <PageHeader
        eyebrow={project.data.code}
        title="Weekly summary"
        description="Once a week the PIs, and members who ask for it, receive the week’s uploads, the lead’s decisions, what awaits review and new warnings by mail, each with a link to its target sheet."
      />
      {settings.isPending ? <StatusLine>Loading the schedule…</StatusLine> : null}
      {settings.isError ? <QueryError what="The schedule" error={settings.error} onRetry={() => void settings.refetch()} /> : null}
      {settings.data ? (
        <div className="grid gap-10 lg:grid-cols-2">
          <Section title="Schedule">
            <SummaryScheduleForm projectId={projectId} settings={settings.data} />
            <DetailList className="mt-4">
              <DetailItem label="Next sending">
                {settings.data.nextRunAt ? when(settings.data.nextRunAt, settings.data.timeZone) : 'None: the summary is off.'}
              </DetailItem>
            </DetailList>
          </Section>
          <Section title="Recipients">
            {settings.data.recipients.length > 0 ? (
              <ul className="space-y-1 text-sm" data-testid="summary-recipients">
                {settings.data.recipients.map((r) => (
                  <li key={r.email}>
                    {r.name} <span className="text-ink-soft">&lt;{r.email}&gt;</span> · {r.reason === 'pi' ? 'PI' : 'asked for it'}
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink-soft">Nobody yet: the project has no PI, and no member has asked for the summary.</p>
            )}
            <p className="mt-2 text-sm text-ink-soft">Other members choose it for themselves under Mail preferences.</p>
            <div className="mt-6">
              <SendNow projectId={projectId} settings={settings.data} />
            </div>
          </Section>
        </div>
      ) : null}
      <Section title="Preview" className="mt-10">
        {preview.isPending ? <StatusLine>Putting the summary together…</StatusLine> : null}
        {preview.isError ? <QueryError what="The preview" error={preview.error} onRetry={() => void preview.refetch()} /> : null}
        {preview.data ? (
          <>
            <p className="mb-4 text-sm text-ink-soft">
              As a PI would receive it now. Subject: <span className="text-ink">{preview.data.subject}</span>
            </p>
            <MailView subject={preview.data.subject} html={preview.data.html} text={preview.data.text} />
          </>
        ) : null}
      </Section>
    </>
  );
}

export function SummaryRoute() {
  const projectId = useNumericParam('projectId');
  if (projectId === null) return <NotFoundMessage />;
  return <SummaryPage key={projectId} projectId={projectId} />;
}
