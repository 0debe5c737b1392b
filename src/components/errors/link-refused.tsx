import type { ReactNode } from 'react';
import { messageFor } from '@shared/errors';
import { isApiError } from '@/lib/api-client';
import { Alert } from '@/components/ui/alert';
import { QueryError } from './query-error';

const LINK_CODES = new Set(['link_unknown', 'link_expired', 'link_used', 'link_revoked']);

/**
 * Why a link from a mail (an invitation, a password reset) no longer opens
 * anything, in the server's words, with what to do next. Other failures
 * (the network, the server) are offered a retry instead.
 */
export function LinkRefused({ error, what, next, onRetry }: { error: Error; what: string; next: ReactNode; onRetry: () => void }) {
  if (isApiError(error) && LINK_CODES.has(error.code)) {
    return (
      <Alert title={messageFor(error.code)}>
        {error.message !== messageFor(error.code) ? <p>{error.message}</p> : null}
        <p className="mt-2">{next}</p>
      </Alert>
    );
  }
  if (isApiError(error) && error.code === 'validation_failed') {
    return (
      <Alert title="This link is incomplete.">
        <p>{error.fieldIssues[0]?.message ?? error.message}</p>
        <p className="mt-2">{next}</p>
      </Alert>
    );
  }
  return <QueryError what={what} error={error} onRetry={onRetry} />;
}

/** The page was opened without the part of the link after “#”. */
export function LinkMissing({ next }: { next: ReactNode }) {
  return (
    <Alert title="This page opens from the link in an e-mail.">
      <p>The address is missing the part after “#”. Open the link from the message again, or copy all of it.</p>
      <p className="mt-2">{next}</p>
    </Alert>
  );
}
