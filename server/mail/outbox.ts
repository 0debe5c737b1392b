import type { Knex } from 'knex';

export const mailPurposes = ['weekly_summary', 'invitation', 'password_reset', 'password_changed', 'review_notice', 'security_alert'] as const;
export type MailPurpose = (typeof mailPurposes)[number];

export interface OutboxMessage {
  purpose: MailPurpose;
  /** Unique per message the product means to send once (project + ISO week, invitation id, reset request id, …). */
  idempotencyKey: string;
  to: string;
  subject: string;
  html: string;
  text: string;
}

/**
 * Queues one message for the outbox worker. Call it with the transaction of
 * the action that causes the mail, so the message exists exactly when the
 * action does; a second call with the same key changes nothing, in this
 * process or another. Returns whether this call queued it.
 */
export async function enqueueMail(trx: Knex | Knex.Transaction, message: OutboxMessage, now: Date = new Date()): Promise<boolean> {
  const at = now.toISOString();
  const inserted = await trx('mail_outbox')
    .insert({
      purpose: message.purpose,
      idempotency_key: message.idempotencyKey,
      to: message.to,
      subject: message.subject,
      html: message.html,
      text: message.text,
      status: 'queued',
      attempts: 0,
      next_attempt_at: at,
      created_at: at,
    })
    .onConflict('idempotency_key')
    .ignore()
    .returning('id');
  return inserted.length === 1;
}
