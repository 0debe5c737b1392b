import { PageHeader } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { EmptyState } from '@/components/ui/empty-state';
import { QueryError } from '@/components/errors/query-error';
import { useMailPreferences } from '@/features/mail/api/get-mail-preferences';
import { MailPreferencesList } from '@/features/mail/components/mail-preferences-list';

/** What Starledger mails this person, per project. */
export function AccountMailRoute() {
  const preferences = useMailPreferences();
  return (
    <>
      <title>Mail preferences · Starledger</title>
      <PageHeader eyebrow="Your account" title="Mail preferences" description="Choose, for each project you belong to, what Starledger sends you by mail." />
      {preferences.isPending ? <StatusLine>Loading your choices…</StatusLine> : null}
      {preferences.isError ? <QueryError what="Your mail preferences" error={preferences.error} onRetry={() => void preferences.refetch()} /> : null}
      {preferences.data ? (
        preferences.data.length > 0 ? (
          <MailPreferencesList preferences={preferences.data} />
        ) : (
          <EmptyState title="No projects yet">When you are added to a project, its mail can be chosen here.</EmptyState>
        )
      ) : null}
    </>
  );
}
