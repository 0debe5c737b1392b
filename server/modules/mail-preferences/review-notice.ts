import crypto from 'node:crypto';
import type { Db } from '../../db/knex';
import { enqueueMail } from '../../mail/outbox';
import { escapeHtml, mailLink, mailPage, mailStyle } from '../../mail/mail-look';
import { valueWords } from '../summary/summary-mail';
import type { PeriodValue } from '../summary/summary.repository';
import { reviewNoticeSubscribers } from './mail-preferences.repository';

/** A decided value, with the version it was decided at and who proposed it. */
export type ReviewedValue = Pick<PeriodValue, 'id' | 'targetId' | 'designation' | 'quantity' | 'value' | 'uncertainty' | 'label'> & { version: number; proposedByUserId: number | null };

/**
 * Queues, inside the review's transaction, one message per person who
 * proposed some of the decided values and asked to hear of it (the reviewer
 * is not told of their own decision). The key names each value with the
 * version it was decided at and the decision, so the same decision is never
 * mailed twice.
 */
export async function enqueueReviewNotices(
  trx: Db,
  input: { projectId: number; projectName: string; reviewerUserId: number; reviewerName: string; decision: 'approved' | 'rejected'; note: string; values: ReviewedValue[]; at: Date; publicUrl: string },
): Promise<number> {
  const proposers = [...new Set(input.values.map((v) => v.proposedByUserId).filter((id): id is number => id !== null && id !== input.reviewerUserId))];
  const subscribers = await reviewNoticeSubscribers(trx, input.projectId, proposers);
  const base = input.publicUrl.replace(/\/+$/, '');
  for (const person of subscribers) {
    const mine = input.values.filter((v) => v.proposedByUserId === person.id).sort((a, b) => a.designation.localeCompare(b.designation, 'en', { numeric: true }) || a.id - b.id);
    if (mine.length === 0) continue;
    const digest = crypto
      .createHash('sha256')
      .update(mine.map((v) => `${v.id}@${v.version}`).join(','))
      .digest('hex')
      .slice(0, 32);
    const verb = input.decision === 'approved' ? 'approved' : 'rejected';
    const subject = `Starledger: ${mine.length === 1 ? 'a value' : `${mine.length} values`} of yours ${verb} in ${input.projectName}`;
    const lines = mine.map((v) => ({ href: `${base}/projects/${input.projectId}/targets/${v.targetId}`, designation: v.designation, words: valueWords(v) }));
    const lead = `${input.reviewerName} ${verb} ${mine.length === 1 ? 'a value you proposed' : `${mine.length} values you proposed`} in ${input.projectName}.`;
    const text = [lead, ...(input.note ? [`Note: ${input.note}`] : []), '', ...lines.flatMap((l) => [`- ${l.designation}: ${l.words}`, `  ${l.href}`]), '', 'You receive this because you asked for it under Mail preferences.', ''].join('\n');
    const html = mailPage({
      title: `Values ${verb}`,
      bodyHtml:
        `<p style="${mailStyle.paragraph}">${escapeHtml(lead)}</p>` +
        (input.note ? `<p style="${mailStyle.paragraph}"><strong>Note:</strong> ${escapeHtml(input.note)}</p>` : '') +
        `<ul style="${mailStyle.list}">${lines.map((l) => `<li style="margin:2px 0">${mailLink(l.href, l.designation)}: <span style="${mailStyle.number}">${escapeHtml(l.words)}</span></li>`).join('')}</ul>`,
      footer: 'You receive this because you asked for it under Mail preferences.',
    });
    await enqueueMail(trx, { purpose: 'review_notice', idempotencyKey: `review_notice:${person.id}:${verb}:${digest}`, to: person.email, subject, html, text }, input.at);
  }
  return subscribers.length;
}
