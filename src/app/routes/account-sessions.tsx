import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { formatCount } from '@/lib/format';
import { useSessions } from '@/features/auth/api/get-sessions';
import { EndOtherSessions, SessionsList } from '@/features/auth/components/sessions-list';

/** Where the person is signed in, with a way to end any of those sessions or all but this one. */
export function AccountSessionsRoute() {
  const sessions = useSessions();
  return (
    <>
      <title>Sessions · Starledger</title>
      <PageHeader
        eyebrow="Your account"
        title="Where you are signed in"
        description={
          <>
            Each browser or device signed in as you.
            {sessions.data
              ? ` A session ends by itself ${formatCount(sessions.data.limits.maxHours, 'hour')} after signing in, or after ${formatCount(sessions.data.limits.idleMinutes, 'minute')} without use.`
              : null}{' '}
            End any you do not recognise, then change your password.
          </>
        }
      />
      {sessions.isPending ? <StatusLine>Loading your sessions…</StatusLine> : null}
      {sessions.isError ? <QueryError what="Your sessions" error={sessions.error} onRetry={() => void sessions.refetch()} /> : null}
      {sessions.data ? (
        <>
          <Section title="Sessions">
            <SessionsList sessions={sessions.data.sessions} />
          </Section>
          <Section title="Everywhere else" className="mt-10">
            <EndOtherSessions others={sessions.data.sessions.filter((s) => !s.current).length} />
          </Section>
        </>
      ) : null}
    </>
  );
}
