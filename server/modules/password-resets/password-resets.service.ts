import { setTimeout as sleep } from 'node:timers/promises';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CompletePasswordResetBody, PasswordResetLookup } from '../../../shared/schemas/auth';
import { AppError } from '../../lib/errors';
import { expiresAfter, hashLinkToken, linkRefusal, newLinkToken, UNKNOWN_LINK } from '../../lib/link-tokens';
import { assertAcceptablePassword, hashPassword } from '../../lib/passwords';
import { enqueueMail } from '../../mail/outbox';
import { appendTrail } from '../trail/trail.repository';
import { findUserByEmail, findUserById, setPasswordHash } from '../users/users.repository';
import { deleteSessionsOf } from '../auth/sessions.repository';
import { passwordResetMail } from './password-reset-mail';
import { queuePasswordChangedMail } from '../users/password-changed-mail';
import { createThrottleCounts, type CountRule } from '../auth/login-throttle';
import { claimReset, closeOpenResets, findResetByHash, insertReset, type StoredReset } from './password-resets.repository';

export const RESET_LIFETIME_MS = 3600 * 1000;
const HOUR_MS = 3600 * 1000;
/**
 * Requests for a reset are counted like failed sign-ins (login-throttle.ts),
 * per account (the e-mail as typed, whether or not an account has it) and
 * per requesting address. An account is sent at most three links and then
 * nothing for an hour, answered as before, so that nobody can fill
 * someone's mailbox from the sign-in page; an address may ask twenty times
 * and is then answered 429 for an hour, alike for every e-mail, so that one
 * client cannot make the server mail many people.
 */
export const resetLimits: { perAccount: CountRule; perAddress: CountRule } = {
  perAccount: { free: 3, firstDelayMs: HOUR_MS, maxDelayMs: HOUR_MS, forgetAfterMs: HOUR_MS },
  perAddress: { free: 20, firstDelayMs: HOUR_MS, maxDelayMs: HOUR_MS, forgetAfterMs: HOUR_MS },
};
/**
 * Every request is answered no sooner than this after it arrived, whether an
 * account has the address or not: the work for a known address (a write and
 * a queued message) then cannot show in the timing.
 */
export const RESET_ANSWER_FLOOR_MS = 250;

export const RESET_REQUESTED_MESSAGE = 'If an account has this address, a message with a link to set a new password is on its way. The link works once, within an hour.';

const refusalWords = {
  link_used: 'This link has already been used to set a password. If you need another, ask for a new link.',
  link_expired: 'This link has expired (a link lasts one hour). Ask for a new one.',
  link_revoked: 'This link no longer works. Ask for a new one.',
} as const;

export function createPasswordResetsService(db: Db, clock: Clock, options: { publicUrl: string; pepper?: string }) {
  const base = options.publicUrl.replace(/\/+$/, '');
  const counts = createThrottleCounts(db, clock);

  async function usable(token: string): Promise<StoredReset> {
    const reset = await findResetByHash(db, hashLinkToken(token));
    if (!reset) throw new AppError(404, 'link_unknown', UNKNOWN_LINK);
    const refusal = linkRefusal(reset, clock.now());
    if (refusal) throw new AppError(410, refusal, refusalWords[refusal]);
    return reset;
  }

  const addressKeyOf = (from: string) => `reset-address:${from}`;

  return {
    /** Seconds the requesting address must still wait before it may ask again (the same whatever the e-mail); 0 when none. */
    addressWaitSeconds(from: string): Promise<number> {
      return counts.waitSeconds([addressKeyOf(from)]);
    },

    /**
     * Queues a reset link when an account has the address and its limit
     * allows, and does the same work otherwise (the counts, a token, its
     * hash and the message are made either way) before answering no sooner
     * than the floor. The caller has asked `addressWaitSeconds` first.
     */
    async request(email: string, from: string): Promise<{ message: string }> {
      const accountKey = `reset-account:${email}`;
      const started = performance.now();
      try {
        const now = clock.now();
        const { token, hash } = newLinkToken();
        const expiresAt = expiresAfter(now, RESET_LIFETIME_MS);
        const accountFree = (await counts.waitSeconds([accountKey])) === 0;
        await counts.count(accountFree ? [[addressKeyOf(from), resetLimits.perAddress], [accountKey, resetLimits.perAccount]] : [[addressKeyOf(from), resetLimits.perAddress]]);
        const user = await findUserByEmail(db, email);
        const mail = passwordResetMail({ name: user?.name ?? 'Observer', href: `${base}/reset-password#${token}`, expiresAt });
        if (user && accountFree) {
          await db.transaction(async (trx) => {
            const id = await insertReset(trx, { userId: user.id, tokenHash: hash, expiresAt }, now);
            await enqueueMail(trx, { purpose: 'password_reset', idempotencyKey: `password_reset:${id}`, to: user.email, ...mail }, now);
          });
        }
      } finally {
        const left = RESET_ANSWER_FLOOR_MS - (performance.now() - started);
        if (left > 0) await sleep(left);
      }
      return { message: RESET_REQUESTED_MESSAGE };
    },

    async lookup(token: string): Promise<PasswordResetLookup> {
      const reset = await usable(token);
      return { email: reset.email, expiresAt: reset.expiresAt };
    },

    /** Sets the new password, uses the link (and every other open link of the account), ends all the account's sessions and queues the notice of the change, in one transaction. */
    async complete(input: CompletePasswordResetBody): Promise<{ userId: number }> {
      const reset = await usable(input.token);
      const name = (await findUserById(db, reset.userId))?.name ?? 'Observer';
      assertAcceptablePassword(input.password, { email: reset.email, name });
      const passwordHash = await hashPassword(input.password, options.pepper);
      const now = clock.now();
      await db.transaction(async (trx) => {
        if (!(await claimReset(trx, reset.id, now))) {
          const again = await findResetByHash(trx, hashLinkToken(input.token));
          const refusal = (again && linkRefusal(again, now)) ?? 'link_used';
          throw new AppError(410, refusal, refusalWords[refusal]);
        }
        await setPasswordHash(trx, reset.userId, passwordHash, now);
        await closeOpenResets(trx, reset.userId, now);
        const ended = await deleteSessionsOf(trx, reset.userId);
        await appendTrail(trx, { projectId: null, actorUserId: reset.userId, action: 'user.password_reset', entityType: 'user', entityId: reset.userId, after: { sessionsEnded: ended } }, now);
        await queuePasswordChangedMail(trx, { email: reset.email, name }, passwordHash, 'reset', now, base);
      });
      return { userId: reset.userId };
    },
  };
}

export type PasswordResetsService = ReturnType<typeof createPasswordResetsService>;
