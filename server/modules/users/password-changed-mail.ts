import type { Knex } from 'knex';
import { sessionStamp } from '../../lib/passwords';
import { noticeMail, utcWords } from '../../mail/link-mail';
import { enqueueMail } from '../../mail/outbox';

/** How the password came to change: on the account page while signed in, or with a reset link. */
export type PasswordChangeWay = 'change' | 'reset';

const wayWords: Record<PasswordChangeWay, string> = {
  change: 'on the account page, by someone signed in as you',
  reset: 'with a reset link sent to this address',
};

/** The notice that an account's password was changed (ASVS 2.2.3, 2.5.5); it names when and how, never the password. */
export function passwordChangedMail(input: { name: string; at: Date; way: PasswordChangeWay; publicUrl: string }) {
  return noticeMail({
    subject: 'Starledger: your password was changed',
    title: 'Your password was changed',
    paragraphs: [
      `${input.name}, your Starledger password was changed on ${utcWords(input.at)}, ${wayWords[input.way]}. Every other place the account was signed in has been signed out; API tokens keep working.`,
      'If this was not you, someone else has your password or can read this mailbox: set a new password at once with “Forgot your password?” on the sign-in page, revoke the API tokens you no longer trust, and tell your site admin.',
    ],
    where: { words: 'Set a new password', href: `${input.publicUrl.replace(/\/+$/, '')}/forgot-password` },
    footer: 'You receive this because the password of the Starledger account with this address was changed. If it was you, there is nothing to do.',
  });
}

/**
 * Queues the notice in the transaction that stores the new password hash,
 * so it is sent exactly when the change holds; keyed by the new hash's
 * stamp, so one change queues one message.
 */
export async function queuePasswordChangedMail(
  trx: Knex.Transaction,
  account: { email: string; name: string },
  newPasswordHash: string,
  way: PasswordChangeWay,
  now: Date,
  publicUrl: string,
): Promise<void> {
  const mail = passwordChangedMail({ name: account.name, at: now, way, publicUrl });
  await enqueueMail(trx, { purpose: 'password_changed', idempotencyKey: `password_changed:${sessionStamp(newPasswordHash)}`, to: account.email, ...mail }, now);
}
