import { useEffect, useState } from 'react';
import type { Strength } from '@/lib/password-strength';
import { cn } from '@/lib/cn';

const WORDS: Record<Strength['score'], string> = { 0: 'very weak', 1: 'weak', 2: 'fair', 3: 'strong', 4: 'very strong' };
const BAR: Record<Strength['score'], string> = { 0: 'bg-alert', 1: 'bg-alert', 2: 'bg-brass', 3: 'bg-good', 4: 'bg-good' };

/**
 * A strength meter under a new password (ASVS 2.1.8): four bars, and the
 * strength in words with what weakens it, so the bars' colour is never the
 * only sign. The words are a polite live region, read out once typing
 * pauses; while it is typed, the last estimate stays. The estimator (src/lib/password-strength.ts) is loaded the first
 * time someone types here.
 */
export function PasswordStrength({ id, password, userInputs = [] }: { id: string; password: string; userInputs?: string[] }) {
  const [strength, setStrength] = useState<Strength | null>(null);
  const inputs = userInputs.join('\n');
  useEffect(() => {
    if (!password) return;
    let current = true;
    // Estimated once typing pauses, so that a screen reader hears the result and not every keystroke.
    const timer = setTimeout(() => {
      void import('@/lib/password-strength').then(({ estimateStrength }) => {
        if (current) setStrength(estimateStrength(password, inputs ? inputs.split('\n') : []));
      });
    }, 300);
    return () => {
      current = false;
      clearTimeout(timer);
    };
  }, [password, inputs]);

  const score = password ? strength?.score : undefined;
  return (
    <div id={id} className="mt-2" data-testid="password-strength">
      <div aria-hidden="true" className="flex gap-1">
        {[0, 1, 2, 3].map((i) => (
          <span key={i} className={cn('h-1.5 flex-1 rounded-full', score !== undefined && Math.max(score, 1) > i ? BAR[score] : 'bg-rule')} />
        ))}
      </div>
      <p aria-live="polite" className="mt-1 text-xs text-ink-soft">
        {score !== undefined && strength ? (
          <>
            <span className="font-semibold text-ink">Strength: {WORDS[score]}.</span>
            {strength.warning ? ` ${strength.warning}` : score < 3 && strength.suggestions[0] ? ` ${strength.suggestions[0]}` : ''}
          </>
        ) : (
          'Strength: shown as you type.'
        )}
      </p>
    </div>
  );
}
