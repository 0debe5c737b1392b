import type { DerivationIssue, DerivedResult } from '@shared/physics/derive';
import { formatResult, QUANTITY_NAMES } from '@shared/physics/display';
import type { QuantityId } from '@shared/physics/quantities';
import { Notation } from '@/components/ui/notation';

/**
 * One derived value as a ledger line: value ± σ and unit in tabular figures,
 * then the method in small type, then its warnings spelt out. Without a
 * value, the line says what it still needs or why it could not be derived.
 * `wording` turns the engine's texts into the page's words.
 */
export function LedgerLine({
  quantity,
  result,
  issues,
  needs,
  wording,
}: {
  quantity: QuantityId;
  result?: DerivedResult;
  issues: DerivationIssue[];
  needs: string;
  wording: (text: string) => string;
}) {
  const name = QUANTITY_NAMES[quantity];
  if (!result) {
    return (
      <div className="border-b border-rule/60 py-2" data-quantity={quantity}>
        <dt className="text-sm font-semibold text-ink">{name}</dt>
        <dd className="text-sm text-ink-soft">
          {issues.length > 0 ? (
            issues.map((issue, i) => (
              <p key={i} className="text-alert">
                <span className="font-semibold">Not derived:</span> <Notation text={wording(issue.message)} />
              </p>
            ))
          ) : (
            <span className="italic">{`Needs ${needs}.`}</span>
          )}
        </dd>
      </div>
    );
  }
  const line = formatResult(result);
  return (
    <div className="border-b border-rule/60 py-2" data-quantity={quantity}>
      <dt className="text-sm font-semibold text-ink">{name}</dt>
      <dd>
        <p className="flex flex-wrap items-baseline gap-x-3 text-base text-ink tabular-nums">
          {quantity === 'luminosity_class' && line.label ? <span className="font-semibold">{line.label}</span> : null}
          {line.values.map((v, i) => (
            <span key={v.unit} className={i === 0 && quantity !== 'luminosity_class' ? 'font-semibold' : 'text-ink-soft'}>
              {i > 0 ? '= ' : ''}
              {v.text}
            </span>
          ))}
        </p>
        <p className="mt-0.5 text-xs text-ink-soft"><Notation text={wording(result.method.label)} /></p>
        {result.warnings.map((w, i) => (
          <p key={i} className="mt-0.5 text-xs text-alert">
            <span className="font-semibold">Warning:</span> <Notation text={wording(w.message)} />
          </p>
        ))}
      </dd>
    </div>
  );
}
