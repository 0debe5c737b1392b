import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { PageHeader, Section } from '@/components/ui/page-header';
import { StatusLine } from '@/components/ui/alert';
import { EmptyState } from '@/components/ui/empty-state';
import { QueryError } from '@/components/errors/query-error';
import { useTokens } from '@/features/tokens/api/get-tokens';
import type { CreatedToken } from '@/features/tokens/api/create-token';
import { CreateTokenForm } from '@/features/tokens/components/create-token-form';
import { NewToken } from '@/features/tokens/components/new-token';
import { TokensList } from '@/features/tokens/components/tokens-list';
import { CurlExample } from '@/features/tokens/components/curl-example';

/** Personal API tokens: what an observing pipeline uses to act as this person without a browser. */
export function AccountTokensRoute() {
  const tokens = useTokens();
  const [created, setCreated] = useState<CreatedToken | null>(null);

  return (
    <>
      <title>API tokens · Starledger</title>
      <PageHeader
        eyebrow="Your account"
        title="API tokens"
        description="A token lets a pipeline or script call the Starledger API as you, with your roles in each project. Make one per program, so each can be revoked on its own."
      />
      {created ? <NewToken created={created} onDone={() => setCreated(null)} /> : null}
      <Section title="Create a token">
        <CreateTokenForm onCreated={setCreated} />
      </Section>
      <Section title="Your tokens" className="mt-10">
        {tokens.isPending ? <StatusLine>Loading your tokens…</StatusLine> : null}
        {tokens.isError ? <QueryError what="Your tokens" error={tokens.error} onRetry={() => void tokens.refetch()} /> : null}
        {tokens.data ? (
          tokens.data.length > 0 ? (
            <TokensList tokens={tokens.data} />
          ) : (
            <EmptyState title="No tokens yet">Create one above when a pipeline needs to send data.</EmptyState>
          )
        ) : null}
      </Section>
      <Section title="Using a token" className="mt-10">
        <p className="mb-3 max-w-prose text-sm text-ink-soft">
          Send it in the <code>Authorization</code> header as <code>Bearer &lt;token&gt;</code>. Requests with a token need no session
          cookie and no CSRF token. Errors come back as JSON with a stable <code>code</code>.
        </p>
        <CurlExample origin={window.location.origin} />
        <p className="mt-3 max-w-prose text-sm text-ink-soft">
          Every route, with its parameters and errors, is in the{' '}
          <Link className={linkClasses} to={paths.apiReference.getHref()}>
            API reference
          </Link>{' '}
          (also as an OpenAPI 3.1 document, <code>/api/openapi.json</code>, for generating clients).
        </p>
      </Section>
    </>
  );
}
