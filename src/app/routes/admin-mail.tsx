import { Link, useSearchParams } from 'react-router-dom';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { EmptyState } from '@/components/ui/empty-state';
import { linkClasses } from '@/components/ui/button';
import { QueryError } from '@/components/errors/query-error';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import { useCaughtMail } from '@/features/mail/api/get-caught-mail';
import { useCaughtMessage } from '@/features/mail/api/get-caught-message';
import { MailView } from '@/features/mail/components/mail-view';

const received = (iso: string) => new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', second: '2-digit', hour12: false }).format(new Date(iso));

function CaughtMessage({ id }: { id: number }) {
  const message = useCaughtMessage(id);
  if (message.isPending) return <StatusLine>Opening the message…</StatusLine>;
  if (message.isError) return <QueryError what="The message" error={message.error} onRetry={() => void message.refetch()} />;
  const m = message.data;
  return (
    <article aria-labelledby="caught-subject">
      <h2 id="caught-subject" className="font-serif text-xl font-semibold">
        {m.subject}
      </h2>
      <p className="mt-1 mb-6 text-sm text-ink-soft">
        From {m.from} to {m.to.join(', ')}, received {received(m.receivedAt)}
      </p>
      <MailView subject={m.subject} html={m.html} text={m.text} />
    </article>
  );
}

/** What the local mail fake received, for the site admin of an installation without real SMTP. */
export function AdminMailRoute() {
  const caught = useCaughtMail();
  const [search] = useSearchParams();
  const chosen = /^[1-9]\d*$/.test(search.get('message') ?? '') ? Number(search.get('message')) : null;

  return (
    <>
      <title>Caught mail · Starledger</title>
      <PageHeader
        eyebrow="Site administration"
        title="Caught mail"
        description="No SMTP server is configured (SMTP_URL), so every message Starledger sends is caught by its local mail fake and kept here and under data/mail/. Nothing leaves this machine."
      />
      {caught.isPending ? <StatusLine>Loading the caught mail…</StatusLine> : null}
      {caught.isError ? (
        isApiError(caught.error) && caught.error.status === 404 ? (
          <EmptyState title="Mail goes to a real SMTP server">There is no mail fake to read: messages are delivered to the server named by SMTP_URL.</EmptyState>
        ) : (
          <QueryError what="The caught mail" error={caught.error} onRetry={() => void caught.refetch()} />
        )
      ) : null}
      {caught.data ? (
        caught.data.length === 0 ? (
          <EmptyState title="Nothing caught yet">Messages appear here a few seconds after Starledger sends them.</EmptyState>
        ) : (
          <div className="grid gap-8 lg:grid-cols-[20rem_1fr]">
            <Section title={`Messages (${caught.data.length})`}>
              <ul className="divide-y divide-rule border-y border-rule text-sm" data-testid="caught-list">
                {caught.data.map((m) => (
                  <li key={m.id} className={cn('py-2', m.id === chosen && 'bg-paper-deep')}>
                    <Link to={`${paths.admin.mail.getHref()}?message=${m.id}`} className={cn(linkClasses, 'font-semibold')} aria-current={m.id === chosen ? 'true' : undefined}>
                      {m.subject || '(no subject)'}
                    </Link>
                    <p className="text-ink-soft">
                      to {m.to.join(', ')} · {received(m.receivedAt)}
                    </p>
                  </li>
                ))}
              </ul>
            </Section>
            <div>{chosen !== null ? <CaughtMessage id={chosen} /> : <StatusLine>Choose a message to read it.</StatusLine>}</div>
          </div>
        )
      ) : null}
    </>
  );
}
