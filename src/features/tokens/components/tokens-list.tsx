import { useState } from 'react';
import type { ApiToken } from '@shared/schemas/tokens';
import { Button } from '@/components/ui/button';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { formatDateTime } from '@/lib/format';
import { useRevokeToken } from '../api/revoke-token';

/** Revoking asks once more, in place, naming the token. */
function RevokeToken({ token }: { token: ApiToken }) {
  const [confirming, setConfirming] = useState(false);
  const revoke = useRevokeToken();
  if (!confirming) {
    return (
      <Button variant="danger" size="sm" onClick={() => setConfirming(true)}>
        Revoke
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Confirm revoking ${token.name}`} className="flex flex-wrap items-center gap-2 text-sm">
      <span>Revoke “{token.name}”? Whatever uses it stops working at once.</span>
      <Button variant="danger" size="sm" disabled={revoke.isPending} onClick={() => revoke.mutate(token.id)}>
        {revoke.isPending ? 'Revoking…' : 'Yes, revoke it'}
      </Button>
      <Button variant="secondary" size="sm" disabled={revoke.isPending} onClick={() => setConfirming(false)}>
        Keep it
      </Button>
      {revoke.isError ? (
        <p role="alert" className="w-full">
          <span className="font-semibold text-alert">Error:</span> {revoke.error.message}
        </p>
      ) : null}
    </div>
  );
}

/** The person's tokens: name, the first characters to recognise it by, when made, last used and expiring, and whether revoked or expired. */
export function TokensList({ tokens }: { tokens: ApiToken[] }) {
  return (
    <LedgerTable aria-label="Your API tokens" data-testid="tokens-table">
      <LedgerHead>
        <tr>
          <LedgerHeaderCell scope="col">Name</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Begins with</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Created</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Last used</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">Expires</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">State</LedgerHeaderCell>
          <LedgerHeaderCell scope="col">
            <span className="sr-only">Revoke</span>
          </LedgerHeaderCell>
        </tr>
      </LedgerHead>
      <LedgerBody>
        {tokens.map((t) => {
          const { expired } = t;
          return (
          <LedgerRow key={t.id} data-token={t.name}>
            <LedgerCell className="font-semibold">{t.name}</LedgerCell>
            <LedgerCell className="font-mono text-xs">{t.prefix}…</LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">{formatDateTime(t.createdAt)}</LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">
              {t.lastUsedAt ? formatDateTime(t.lastUsedAt) : <span className="text-ink-soft">never</span>}
            </LedgerCell>
            <LedgerCell className="whitespace-nowrap tabular-nums">{formatDateTime(t.expiresAt)}</LedgerCell>
            <LedgerCell>
              {t.revokedAt ? (
                <span>
                  Revoked <span className="text-ink-soft tabular-nums">{formatDateTime(t.revokedAt)}</span>
                </span>
              ) : expired ? (
                <span>Expired</span>
              ) : (
                <span className="font-semibold">Active</span>
              )}
            </LedgerCell>
            <LedgerCell>{t.revokedAt || expired ? null : <RevokeToken token={t} />}</LedgerCell>
          </LedgerRow>
          );
        })}
      </LedgerBody>
    </LedgerTable>
  );
}
