import { useState } from 'react';
import type { AccountSession } from '@shared/schemas/sessions';
import { Button } from '@/components/ui/button';
import { Alert } from '@/components/ui/alert';
import { ConfirmInPlace } from '@/components/ui/confirm-in-place';
import { ConfirmationField } from '@/components/ui/confirmation-field';
import { useUser } from '@/lib/auth';
import { confirmationBody, confirmationRefusal } from '@/lib/confirmation';
import { formatCount, formatDateTime } from '@/lib/format';
import { useEndSession } from '../api/end-session';
import { useEndOtherSessions } from '../api/end-other-sessions';

function nameOf(s: AccountSession): string {
  return s.browser ?? 'An unnamed browser or program';
}

/** The confirmation box of an ending's question, with the server's refusal of it at the box. */
function EndingConfirmation({ typed, onType, error }: { typed: string; onType: (typed: string) => void; error?: string }) {
  const user = useUser();
  return (
    <ConfirmationField
      account={user.email}
      secondFactorOn={user.secondFactor}
      error={error}
      className="w-full max-w-sm"
      autoFocus
      value={typed}
      onChange={(e) => onType(e.target.value)}
    />
  );
}

/** Ending asks once more, in place, naming the browser, with the password or a code (ASVS 3.3.4). */
function EndSession({ session }: { session: AccountSession }) {
  const user = useUser();
  const [confirming, setConfirming] = useState(false);
  const [typed, setTyped] = useState('');
  const end = useEndSession();
  const refusal = confirmationRefusal(end.error);
  if (!confirming) {
    return (
      <Button variant="danger" size="sm" onClick={() => setConfirming(true)} aria-label={`End this session (${nameOf(session)}, last used ${formatDateTime(session.lastSeenAt)})`}>
        End this session
      </Button>
    );
  }
  return (
    <ConfirmInPlace
      label={`Confirm ending the session of ${nameOf(session)}`}
      question="End it? That browser is signed out at once."
      yes="Yes, end it"
      busy={end.isPending}
      busyText="Ending…"
      error={refusal.other}
      onYes={() => end.mutate({ sessionId: session.id, ...confirmationBody(typed, user.secondFactor) })}
      onKeep={() => setConfirming(false)}
    >
      <EndingConfirmation typed={typed} onType={setTyped} error={refusal.field} />
    </ConfirmInPlace>
  );
}

/** Every other session at once, after one more question and the password or a code. */
export function EndOtherSessions({ others }: { others: number }) {
  const user = useUser();
  const [confirming, setConfirming] = useState(false);
  const [typed, setTyped] = useState('');
  const endOthers = useEndOtherSessions();
  const refusal = confirmationRefusal(endOthers.error);
  if (endOthers.isSuccess && !confirming) {
    return <Alert kind="done" title={`${formatCount(endOthers.data.ended, 'other session')} ended.`} />;
  }
  if (others === 0) return <p className="text-sm text-ink-soft">You are signed in nowhere else.</p>;
  if (!confirming) {
    return (
      <Button variant="danger" onClick={() => setConfirming(true)}>
        Sign out everywhere else
      </Button>
    );
  }
  return (
    <ConfirmInPlace
      label="Confirm signing out everywhere else"
      question={`End ${formatCount(others, 'other session')}? This browser stays signed in.`}
      yes="Yes, end them"
      busy={endOthers.isPending}
      busyText="Ending…"
      keep="Keep them"
      error={refusal.other}
      onYes={() =>
        endOthers.mutate(confirmationBody(typed, user.secondFactor), {
          onSuccess: () => {
            setConfirming(false);
            setTyped('');
          },
        })
      }
      onKeep={() => setConfirming(false)}
    >
      <EndingConfirmation typed={typed} onType={setTyped} error={refusal.field} />
    </ConfirmInPlace>
  );
}

/** One entry per session: the browser and system, when it began and was last used, the address, this browser marked. */
export function SessionsList({ sessions }: { sessions: AccountSession[] }) {
  return (
    <ul aria-label="Your sessions" className="space-y-4" data-testid="sessions-list">
      {sessions.map((s) => (
        <li key={s.id} className="rounded-sm border border-rule bg-paper px-4 py-3" data-current={s.current ? 'yes' : 'no'}>
          <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
            <h3 className="font-semibold text-ink">
              {nameOf(s)}
              {s.current ? <span className="ml-2 rounded-sm border border-brass px-1.5 py-0.5 text-xs font-semibold text-brass-deep">This browser</span> : null}
            </h3>
            {s.current ? null : <EndSession session={s} />}
          </div>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 border-t border-rule pt-2 text-sm">
            <dt className="font-semibold text-ink-soft">Signed in</dt>
            <dd className="tabular-nums">{formatDateTime(s.signedInAt)}</dd>
            <dt className="font-semibold text-ink-soft">Last used</dt>
            <dd className="tabular-nums">{formatDateTime(s.lastSeenAt)}</dd>
            <dt className="font-semibold text-ink-soft">Address</dt>
            <dd className="tabular-nums">{s.address ?? <span className="text-ink-soft">not known</span>}</dd>
            <dt className="col-span-2 mt-1 font-semibold text-ink-soft">User agent</dt>
            <dd className="col-span-2 font-mono text-xs break-all text-ink-soft">{s.userAgent ?? 'none sent'}</dd>
          </dl>
        </li>
      ))}
    </ul>
  );
}
