import { createHash } from 'node:crypto';
import type { Db } from '../../db/knex';
import { noticeMail, utcWords } from '../../mail/link-mail';
import { enqueueMail } from '../../mail/outbox';

/**
 * The mail that tells every site admin a sign-in delay has begun for an
 * account or an address (ASVS 8.1.4: an abnormal number of requests raises
 * an alert). Keyed by the subject and the UTC hour, so one subject brings at
 * most one mail an hour however many failures follow; the key holds the
 * subject's SHA-256, not the e-mail or address itself.
 */
export async function queueThrottleAlert(db: Db, input: { subject: string; failures: number; at: Date; publicUrl: string }): Promise<number> {
  const hour = input.at.toISOString().slice(0, 13);
  const subjectHash = createHash('sha256').update(input.subject).digest('hex').slice(0, 32);
  const [kind, ...rest] = input.subject.split(':');
  const who = rest.join(':');
  const words = kind === 'account' ? `the account e-mail “${who}”` : `the address ${who}`;
  const mail = noticeMail({
    subject: 'Starledger: sign-ins are being slowed',
    title: 'Sign-ins are being slowed',
    paragraphs: [
      `On ${utcWords(input.at)}, ${input.failures} failed sign-ins for ${words} started a delay before each further attempt.`,
      'This is what guessing passwords looks like, or a person who forgot theirs. The delay passes by itself; nothing is locked. The server log names each failure (event sign_in_failed) with its address and request id.',
    ],
    where: { words: 'See the accounts', href: `${input.publicUrl.replace(/\/+$/, '')}/admin/users` },
    footer: 'You receive this because you are a site admin of this Starledger. At most one such mail an hour is sent for one account or address.',
  });
  return db.transaction(async (trx) => {
    const admins: { id: number; email: string }[] = await trx('users').where({ is_site_admin: true }).select('id', 'email');
    let queued = 0;
    for (const admin of admins) {
      if (await enqueueMail(trx, { purpose: 'security_alert', idempotencyKey: `security_alert:${subjectHash}:${hour}:${admin.id}`, to: admin.email, ...mail }, input.at)) queued += 1;
    }
    return queued;
  });
}
