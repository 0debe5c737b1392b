import { createHash, randomBytes } from 'node:crypto';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { User } from '../../../shared/schemas/auth';
import { notFound } from '../../lib/errors';
import { findUserById } from '../users/users.repository';
import { appendTrail } from '../trail/trail.repository';
import { describeForLog } from '../../middleware/error-handler';
import { findTokenOwner, insertToken, listTokens, revokeToken, touchToken, type StoredToken } from './tokens.repository';
import type { ApiToken } from '../../../shared/schemas/tokens';

const PREFIX = 'slt_';
const hashOf = (token: string) => createHash('sha256').update(token).digest('hex');

/**
 * A token's "last used" is stamped at most this often: a pipeline polling
 * every second would otherwise turn each of its reads into a write, and a
 * read must not wait on (or fail for) a lock someone else holds.
 */
export const TOUCH_INTERVAL_MS = 60_000;

export function createTokensService(db: Db, clock: Clock) {
  const withExpiry = (t: StoredToken): ApiToken => ({ ...t, expired: Date.parse(t.expiresAt) <= clock.now().getTime() });

  /** When each token's stamp was last written by this process. */
  const stamped = new Map<number, number>();

  /**
   * Not awaited by the request: the read goes on whether the stamp is
   * written, skipped because the database is busy (tried again on the next
   * use) or fails.
   */
  function stamp(tokenId: number): void {
    const now = clock.now();
    const last = stamped.get(tokenId);
    if (last !== undefined && now.getTime() - last < TOUCH_INTERVAL_MS) return;
    stamped.set(tokenId, now.getTime());
    touchToken(db, tokenId, now).then(
      (written) => {
        if (!written) stamped.delete(tokenId);
      },
      (err: unknown) => {
        stamped.delete(tokenId);
        console.error('[api token last-used stamp]', describeForLog(err));
      },
    );
  }

  return {
    /** Makes a token; the plain text is returned once and only its hash is kept. */
    async create(userId: number, name: string, lifetimeDays: number) {
      const token = PREFIX + randomBytes(32).toString('base64url');
      const apiToken = await db.transaction(async (trx) => {
        const now = clock.now();
        const expiresAt = new Date(now.getTime() + lifetimeDays * 86_400_000);
        const made = await insertToken(trx, { userId, name, hash: hashOf(token), prefix: token.slice(0, 10), expiresAt }, now);
        // A token acts with its owner's roles in every project, so its entry belongs to no one project.
        await appendTrail(
          trx,
          { projectId: null, actorUserId: userId, action: 'token.created', entityType: 'token', entityId: made.id, after: { name: made.name, prefix: made.prefix, expiresAt: made.expiresAt } },
          now,
        );
        return made;
      });
      return { token, apiToken: withExpiry(apiToken) };
    },

    list: async (userId: number) => (await listTokens(db, userId)).map(withExpiry),

    async revoke(userId: number, tokenId: number): Promise<void> {
      await db.transaction(async (trx) => {
        const now = clock.now();
        if ((await revokeToken(trx, userId, tokenId, now)) === 0) throw notFound('No such active token.');
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'token.revoked', entityType: 'token', entityId: tokenId }, now);
      });
    },

    /**
     * The owner of a live token; `expired` (with when) for a token past its
     * expiry, which stays refused (a token with no expiry, which the
     * migrations never leave, is taken as expired); undefined for anything else.
     */
    async userFor(token: string): Promise<User | { expired: string | null } | undefined> {
      if (!token.startsWith(PREFIX)) return undefined;
      const found = await findTokenOwner(db, hashOf(token));
      if (!found) return undefined;
      if (found.expiresAt === null || Date.parse(found.expiresAt) <= clock.now().getTime()) return { expired: found.expiresAt };
      stamp(found.id);
      return findUserById(db, found.userId);
    },
  };
}

export type TokensService = ReturnType<typeof createTokensService>;
