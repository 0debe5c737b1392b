import { formatResult } from '../../../shared/physics/display';
import { QUANTITY_NAMES, readableMessage } from '../../../shared/physics/display';
import type { QuantityId } from '../../../shared/physics/quantities';
import { escapeHtml, mailLink, mailPage, mailStyle } from '../../mail/mail-look';
import type { PeriodUpload, PeriodValue } from './summary.repository';

/** One line about one target, with the link to its sheet. */
export interface TargetLine {
  targetId: number;
  designation: string;
  href: string;
  items: string[];
  /** How many values the line stands for (it may name fewer). */
  count: number;
}

/** What a weekly summary says, already cut to what its reader may see. */
export interface WeeklySummaryContent {
  projectName: string;
  projectCode: string;
  week: string;
  /** "23 Nov – 30 Nov 2026", in the site's time zone. */
  periodText: string;
  projectHref: string;
  reviewHref: string | null;
  uploads: (PeriodUpload & { href: string; targetLinks: { designation: string; href: string }[] })[];
  approved: TargetLine[];
  rejected: TargetLine[];
  awaiting: TargetLine[];
  warnings: TargetLine[];
  failedChecks: TargetLine[];
}

export function quantityName(quantity: string): string {
  return QUANTITY_NAMES[quantity as QuantityId] ?? quantity.replace(/_/g, ' ');
}

/** "Luminosity 0.92 ± 0.03 L☉", the value as the sheet prints it. */
export function valueWords(v: Pick<PeriodValue, 'quantity' | 'value' | 'uncertainty' | 'label'>): string {
  try {
    const line = formatResult({ quantity: v.quantity as QuantityId, value: v.value, uncertainty: v.uncertainty, label: v.label ?? undefined });
    return `${line.name} ${line.values.map((x) => x.text).join(', ')}`;
  } catch {
    return quantityName(v.quantity);
  }
}

/** The quantities a PI reads first, in this order; a target's other values are counted, not listed. */
const HEADLINE: readonly string[] = ['temperature', 'spectral_class', 'luminosity', 'radius', 'distance_parallax'];

/**
 * Groups values by target, one line per target, in the order given. With
 * `max`, a line names at most that many (headline quantities first) and
 * ends with how many more there are, so a digest stays a digest.
 */
export function byTarget(values: readonly PeriodValue[], href: (targetId: number) => string, words: (v: PeriodValue) => string, max = Infinity): TargetLine[] {
  const groups = new Map<number, PeriodValue[]>();
  for (const v of values) groups.set(v.targetId, [...(groups.get(v.targetId) ?? []), v]);
  return [...groups.entries()].map(([targetId, group]) => {
    const rank = (v: PeriodValue) => (HEADLINE.includes(v.quantity) ? HEADLINE.indexOf(v.quantity) : HEADLINE.length);
    const ordered = max === Infinity ? group : [...group].sort((a, b) => rank(a) - rank(b));
    const items = [...new Set(ordered.map(words))];
    const shown = items.slice(0, max);
    if (items.length > shown.length) shown.push(`and ${items.length - shown.length} more`);
    return { targetId, designation: group[0].designation, href: href(targetId), items: shown, count: group.length };
  });
}

export function warningWords(v: PeriodValue): string[] {
  return v.warnings.map((w) => {
    const text = readableMessage(w.message);
    return `${text.charAt(0).toUpperCase()}${text.slice(1)}`;
  });
}

export function isEmpty(c: WeeklySummaryContent): boolean {
  return [c.uploads, c.approved, c.rejected, c.awaiting, c.warnings, c.failedChecks].every((list) => list.length === 0);
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const count = (lines: TargetLine[]) => lines.reduce((n, l) => n + l.count, 0);

export function summarySubject(c: WeeklySummaryContent): string {
  return `Starledger weekly summary: ${c.projectName}, ${c.week}`;
}

function nothingLine(c: WeeklySummaryContent): string {
  return `Nothing to report for ${c.projectName} in ${c.periodText}: no uploads, no decisions, nothing awaiting review and no new warnings.`;
}

/** A line's items as one sentence-like run: "a; b; and 3 more". */
function itemsText(items: readonly string[]): string {
  return items.map((i) => i.replace(/\.$/, '')).join('; ');
}

interface Section {
  title: string;
  lead: string;
  lines: { designation: string; href: string; items: string[] }[];
}

function sections(c: WeeklySummaryContent): Section[] {
  const out: Section[] = [];
  if (c.uploads.length > 0) {
    out.push({
      title: 'Uploads received',
      lead: `${plural(c.uploads.length, 'file')} committed, ${plural(
        c.uploads.reduce((n, u) => n + u.rowCount, 0),
        'row',
      )}.`,
      lines: c.uploads.map((u) => ({
        designation: u.filename,
        href: u.href,
        items: [
          `${u.kind === 'spectrum' ? 'spectrum' : plural(u.rowCount, 'row')}${u.by ? ` from ${u.by}` : ''}`,
          ...(u.targetLinks.length > 0 ? [`targets ${u.targetLinks.slice(0, 12).map((t) => t.designation).join(', ')}${u.targetLinks.length > 12 ? ` and ${u.targetLinks.length - 12} more` : ''}`] : []),
        ],
      })),
    });
  }
  if (c.approved.length > 0) out.push({ title: 'Values approved', lead: `${plural(count(c.approved), 'value')} of ${plural(c.approved.length, 'target')}.`, lines: c.approved });
  if (c.rejected.length > 0) out.push({ title: 'Values rejected', lead: `${plural(count(c.rejected), 'value')}.`, lines: c.rejected });
  if (c.awaiting.length > 0) out.push({ title: 'Awaiting review', lead: `${plural(count(c.awaiting), 'value')} of ${plural(c.awaiting.length, 'target')} wait for the lead astronomer.`, lines: c.awaiting });
  if (c.warnings.length > 0) out.push({ title: 'New warnings', lead: `On values derived this week, for ${plural(c.warnings.length, 'target')}.`, lines: c.warnings });
  if (c.failedChecks.length > 0) out.push({ title: 'Cross-checks that disagree', lead: `${plural(c.failedChecks.length, 'target')} where two routes to a quantity disagree.`, lines: c.failedChecks });
  return out;
}

export function summaryText(c: WeeklySummaryContent): string {
  const head = [`${c.projectName} (${c.projectCode}), week ${c.week}`, c.periodText, ''];
  if (isEmpty(c)) return [...head, nothingLine(c), '', `Project: ${c.projectHref}`, ''].join('\n');
  const body = sections(c).flatMap((s) => [
    s.title.toUpperCase(),
    s.lead,
    ...s.lines.flatMap((l) => [`- ${l.designation}: ${itemsText(l.items)}`, `  ${l.href}`]),
    '',
  ]);
  return [...head, ...body, ...(c.reviewHref ? [`Review queue: ${c.reviewHref}`] : []), `Project: ${c.projectHref}`, '', footer(c), ''].join('\n');
}

function footer(c: WeeklySummaryContent): string {
  return `Sent by Starledger once a week for ${c.projectName}. PIs receive it; other members choose it under Mail preferences.`;
}

export function summaryHtml(c: WeeklySummaryContent): string {
  const intro = `<p style="${mailStyle.small}">${escapeHtml(`${c.projectCode} · week ${c.week} · ${c.periodText}`)}</p>`;
  let body: string;
  if (isEmpty(c)) {
    body = `${intro}<p style="${mailStyle.paragraph}">${escapeHtml(nothingLine(c))}</p>`;
  } else {
    body =
      intro +
      sections(c)
        .map(
          (s) =>
            `<h2 style="${mailStyle.heading}">${escapeHtml(s.title)}</h2><p style="${mailStyle.paragraph}">${escapeHtml(s.lead)}</p><ul style="${mailStyle.list}">${s.lines
              .map((l) => `<li style="margin:2px 0">${mailLink(l.href, l.designation)}: <span style="${mailStyle.number}">${escapeHtml(itemsText(l.items))}</span></li>`)
              .join('')}</ul>`,
        )
        .join('\n') +
      (c.reviewHref ? `<p style="margin:20px 0 4px"><a href="${escapeHtml(c.reviewHref)}" style="${mailStyle.button}">Open the review queue</a></p>` : '');
  }
  body += `<p style="${mailStyle.paragraph}">${mailLink(c.projectHref, `Open ${c.projectName}`)}</p>`;
  return mailPage({ title: `Weekly summary: ${c.projectName}`, preheader: isEmpty(c) ? nothingLine(c) : `${sections(c).map((s) => s.title).join(', ')}.`, bodyHtml: body, footer: footer(c) });
}
