import { useEffect, useRef, useState } from 'react';
import { reviewBody, type QueueItem, type ReviewResult, type StaleValueDetail } from '@shared/schemas/derived';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextAreaField } from '@/components/ui/field';
import { isApiError } from '@/lib/api-client';
import { DERIVED_STATUS_WORDS, quantityNameInText } from '@/lib/derived-words';
import { formatCount } from '@/lib/format';
import { staleValues, unapprovableValues, useReviewValues, type UnapprovableDetail } from '../api/review-values';
import { Notation } from '@/components/ui/notation';

type Decision = 'approve' | 'reject';

/** An upstream value approving the selection would approve too, named with its target. */
interface UpstreamToApprove {
  id: number;
  version: number;
  quantity: string;
  revision: number;
  designation: string;
}

/** The proposed upstream values of the selection that the lead has not selected themself. */
function unselectedUpstream(selected: readonly QueueItem[]): UpstreamToApprove[] {
  const chosen = new Set(selected.map((i) => i.proposed.id));
  const out = new Map<number, UpstreamToApprove>();
  for (const item of selected) {
    for (const u of item.upstream) {
      if (!chosen.has(u.id) && !out.has(u.id)) out.set(u.id, { ...u, designation: item.target.designation });
    }
  }
  return [...out.values()];
}

/** What was done, for the page's status line. */
export interface DecisionOutcome {
  decision: Decision;
  result: ReviewResult;
}

type Problem =
  | { kind: 'stale'; details: StaleValueDetail[] }
  | { kind: 'unapprovable'; details: UnapprovableDetail[] }
  | { kind: 'other'; message: string };

/**
 * The lead's one note and the two decisions for the selected values. A
 * rejection needs the note (the shared schema's rule, checked here before
 * sending and again by the server). Approving a value whose proposed
 * upstream values are not selected first lists them and asks to confirm,
 * because the server approves them in the same transaction. A stale
 * decision keeps the note and the selection and says what changed.
 */
export function DecisionPanel({
  projectId,
  selected,
  designationOf,
  onDecided,
  onStale,
}: {
  projectId: number;
  selected: readonly QueueItem[];
  designationOf: (targetId: number) => string;
  onDecided: (outcome: DecisionOutcome) => void;
  onStale: () => void;
}) {
  const review = useReviewValues(projectId);
  const [note, setNote] = useState('');
  const [noteError, setNoteError] = useState<string | undefined>();
  const [problem, setProblem] = useState<Problem | null>(null);
  const [confirming, setConfirming] = useState<UpstreamToApprove[] | null>(null);
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const approveRef = useRef<HTMLButtonElement>(null);
  const confirmHeadingRef = useRef<HTMLHeadingElement>(null);
  const problemRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (confirming) confirmHeadingRef.current?.focus();
  }, [confirming]);
  useEffect(() => {
    if (problem) problemRef.current?.focus();
  }, [problem]);

  // The selection changed under an open confirmation: what it listed may no longer hold.
  const selectionKey = selected.map((i) => `${i.proposed.id}@${i.proposed.version}`).join(',');
  const [confirmedFor, setConfirmedFor] = useState(selectionKey);
  if (confirming && confirmedFor !== selectionKey) {
    setConfirming(null);
    setConfirmedFor(selectionKey);
  }

  function send(decision: Decision, extra: readonly UpstreamToApprove[]) {
    const items = [...selected.map((i) => ({ id: i.proposed.id, version: i.proposed.version })), ...extra.map(({ id, version }) => ({ id, version }))];
    setProblem(null);
    review.mutate(
      { decision, items, note },
      {
        onSuccess: (result) => {
          setNote('');
          setConfirming(null);
          onDecided({ decision, result });
        },
        onError: (error) => {
          setConfirming(null);
          const stale = staleValues(error);
          const unapprovable = unapprovableValues(error);
          const noteIssue = isApiError(error) ? error.fieldIssues.find((f) => f.path === 'note') : undefined;
          if (stale.length > 0) {
            setProblem({ kind: 'stale', details: stale });
            onStale();
          } else if (unapprovable.length > 0) {
            setProblem({ kind: 'unapprovable', details: unapprovable });
          } else if (noteIssue) {
            setNoteError(noteIssue.message);
            noteRef.current?.focus();
          } else {
            setProblem({ kind: 'other', message: error.message });
          }
        },
      },
    );
  }

  function decide(decision: Decision) {
    setNoteError(undefined);
    setProblem(null);
    const checked = reviewBody.safeParse({ decision, items: selected.map((i) => ({ id: i.proposed.id, version: i.proposed.version })), note });
    if (!checked.success) {
      const noteIssue = checked.error.issues.find((issue) => issue.path[0] === 'note');
      const itemsIssue = checked.error.issues.find((issue) => issue.path[0] === 'items');
      if (noteIssue) {
        setNoteError(noteIssue.message);
        noteRef.current?.focus();
      }
      if (itemsIssue) setProblem({ kind: 'other', message: itemsIssue.message });
      return;
    }
    const extra = decision === 'approve' ? unselectedUpstream(selected) : [];
    if (extra.length > 0) {
      setConfirmedFor(selectionKey);
      setConfirming(extra);
      return;
    }
    send(decision, []);
  }

  const count = selected.length;

  return (
    <section aria-labelledby="decision-heading" className="rounded-sm border border-rule bg-paper-deep/60 p-4" data-testid="decision-panel">
      <h2 id="decision-heading" tabIndex={-1} className="text-lg font-semibold text-ink">
        Decide
      </h2>
      <p className="mt-1 text-sm text-ink" data-testid="selection-count">
        {count === 0 ? 'No values selected.' : `${formatCount(count, 'value')} selected.`}
      </p>
      <TextAreaField
        ref={noteRef}
        className="mt-3"
        label="Note"
        hint="One note for every selected value; kept in the review trail. Required to reject."
        value={note}
        maxLength={2000}
        error={noteError}
        onChange={(e) => {
          setNote(e.target.value);
          if (noteError) setNoteError(undefined);
        }}
      />
      {confirming ? (
        <div role="group" aria-labelledby="confirm-upstream-heading" className="mt-3 rounded-sm border-l-4 border-brass bg-paper px-3 py-2 text-sm">
          <h3 id="confirm-upstream-heading" ref={confirmHeadingRef} tabIndex={-1} className="font-semibold text-ink">
            Approving these also approves:
          </h3>
          <ul className="mt-1 list-disc pl-5" data-testid="upstream-list">
            {confirming.map((u) => (
              <li key={u.id}>
                {quantityNameInText(u.quantity)} r{u.revision} ({u.designation})
              </li>
            ))}
          </ul>
          <p className="mt-1 text-ink-soft">The values rest on them, and a reader must never see a value resting on unapproved ones.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button onClick={() => send('approve', confirming)} disabled={review.isPending}>
              {review.isPending ? 'Approving…' : `Approve all ${count + confirming.length}`}
            </Button>
            <Button
              variant="secondary"
              onClick={() => {
                setConfirming(null);
                approveRef.current?.focus();
              }}
            >
              Cancel
            </Button>
          </div>
        </div>
      ) : null}
      {problem ? (
        <div ref={problemRef} tabIndex={-1} className="mt-3" data-testid="decision-problem">
          {problem.kind === 'stale' ? (
            <Alert title="Some values changed since you saw them; the queue now shows them as they are. Nothing was decided.">
              <ul className="list-disc pl-5">
                {problem.details.map((d) => (
                  <li key={d.id}>
                    {designationOf(d.targetId)}, {quantityNameInText(d.quantity)}: <Notation text={d.message} />{' '}
                    {d.current
                      ? `(current: revision ${d.current.revision}, ${DERIVED_STATUS_WORDS[d.current.status].toLowerCase()})`
                      : '(no longer in the queue)'}
                  </li>
                ))}
              </ul>
              <p className="mt-1">Your note is kept; look at the values again and decide.</p>
            </Alert>
          ) : problem.kind === 'unapprovable' ? (
            <Alert title="These values cannot be approved yet. Nothing was decided.">
              <ul className="list-disc pl-5">
                {problem.details.map((d) => (
                  <li key={d.id}>
                    {quantityNameInText(d.quantity)}: <Notation text={d.message} />
                  </li>
                ))}
              </ul>
            </Alert>
          ) : (
            <Alert title="Nothing was decided.">{problem.message}</Alert>
          )}
        </div>
      ) : null}
      <div className="mt-3 flex flex-wrap gap-2">
        <Button ref={approveRef} onClick={() => decide('approve')} disabled={review.isPending}>
          {review.isPending ? 'Sending…' : count > 1 ? `Approve ${count} values` : 'Approve'}
        </Button>
        <Button variant="danger" onClick={() => decide('reject')} disabled={review.isPending}>
          {count > 1 ? `Reject ${count} values` : 'Reject'}
        </Button>
      </div>
    </section>
  );
}
