import { useState } from 'react';
import { PageHeader, Section } from '@/components/ui/page-header';
import { Alert, StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { formatCount } from '@/lib/format';
import { useUser } from '@/lib/auth';
import { useSecondFactor } from '@/features/second-factor/api/get-second-factor';
import type { TurnedOn } from '@/features/second-factor/api/confirm-second-factor';
import { EnrolSecondFactor } from '@/features/second-factor/components/enrol-second-factor';
import { RecoveryCodes } from '@/features/second-factor/components/recovery-codes';
import { TurnOffSecondFactorForm } from '@/features/second-factor/components/turn-off-second-factor-form';

/** The second factor at sign-in: turning it on (with the recovery codes, shown once), how many of those are left, turning it off. */
export function AccountSecondFactorRoute() {
  const user = useUser();
  const status = useSecondFactor();
  const [turnedOn, setTurnedOn] = useState<TurnedOn | null>(null);
  const [turnedOff, setTurnedOff] = useState<string | null>(null);

  return (
    <>
      <title>Second factor · Starledger</title>
      <PageHeader
        eyebrow="Your account"
        title="Second factor"
        description="A one-time code from an authenticator app, asked for at sign-in after your password, so that a password alone does not open your account."
      />
      {status.isPending ? <StatusLine>Loading…</StatusLine> : null}
      {status.isError ? <QueryError what="Your second factor" error={status.error} onRetry={() => void status.refetch()} /> : null}
      {turnedOn ? (
        <Section title="Your recovery codes">
          <RecoveryCodes codes={turnedOn.recoveryCodes} account={user.email} message={turnedOn.message} onDone={() => setTurnedOn(null)} />
        </Section>
      ) : status.data ? (
        status.data.on ? (
          <>
            <Section title="On">
              <p className="max-w-prose text-sm">
                Sign-in asks for a code after your password.{' '}
                <span data-testid="recovery-codes-left">{formatCount(status.data.recoveryCodesLeft, 'recovery code')} left unused.</span>
                {status.data.recoveryCodesLeft <= 3 ? ' When they run out, turn the second factor off and on again for ten new ones.' : null}
              </p>
            </Section>
            <Section title="Turn it off" className="mt-10">
              <TurnOffSecondFactorForm account={user.email} onTurnedOff={setTurnedOff} />
            </Section>
          </>
        ) : (
          <Section title="Turn it on">
            {turnedOff ? <Alert kind="done" title={turnedOff} className="mb-4" /> : null}
            <EnrolSecondFactor
              onTurnedOn={(on) => {
                setTurnedOff(null);
                setTurnedOn(on);
              }}
            />
          </Section>
        )
      ) : null}
    </>
  );
}
