import type { DerivedValue } from '@shared/schemas/derived';
import { crossChecks, newestStanding, type CrossCheckVerdict } from '@shared/physics/cross-checks';
import { Notation } from '@/components/ui/notation';

/** The newest revision of each quantity still standing (approved or proposed), the one the sheet shows first. */
export function currentValues(revisions: readonly DerivedValue[]): DerivedValue[] {
  return newestStanding(revisions);
}

/** The verdict as a word, so it never rests on colour alone. */
const VERDICT_WORDS: Readonly<Record<CrossCheckVerdict, string>> = {
  agree: 'Agrees',
  differ: 'Differs',
  disagree: 'Disagrees',
  note: 'Engine note',
};

/** The sheet's cross-checks: each comparison in a sentence with its verdict as a word. */
export function CrossChecks({ revisions }: { revisions: readonly DerivedValue[] }) {
  const current = currentValues(revisions);
  const checks = crossChecks(current);
  const fromProposals = current.some((v) => v.status === 'proposed');
  if (checks.length === 0) {
    return (
      <p className="text-sm text-ink-soft" data-testid="cross-checks-none">
        No two routes to the same quantity can be compared yet: a cross-check needs, for example, both a parallax and a photometric distance, or two
        temperatures.
      </p>
    );
  }
  return (
    <div data-testid="cross-checks">
      <ul className="divide-y divide-rule border-y border-rule">
        {checks.map((c) => (
          <li key={c.id} className="grid gap-x-4 gap-y-0.5 py-2 text-sm sm:grid-cols-[7rem_minmax(0,1fr)]" data-verdict={c.verdict}>
            <span className={`text-xs font-semibold tracking-wide uppercase ${c.verdict === 'disagree' ? 'text-alert' : 'text-ink-soft'}`}>
              {VERDICT_WORDS[c.verdict]}
            </span>
            <span className="text-ink">
              <Notation text={c.text} />
            </span>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-ink-soft">
        σ apart is |a − b| / √(σ<sub>a</sub>² + σ<sub>b</sub>²), the measure the engine warns by.
        {fromProposals ? ' Where a quantity has a proposal newer than its approved value, the proposal is compared.' : ''}
      </p>
    </div>
  );
}
