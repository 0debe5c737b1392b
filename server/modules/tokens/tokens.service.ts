import { createHash, randomBytes } from 'node:crypto';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { User } from '../../../shared/schemas/auth';
import { notFound } from '../../lib/errors';
import { findUserById } from '../users/users.repository';
import { appendTrail } from '../trail/trail.repository';
import { findTokenOwner, insertToken, listTokens, revokeToken, touchToken } from './tokens.repository';

const PREFIX = 'slt_';
const hashOf = (token: string) => createHash('sha256').update(token).digest('hex');

export function createTokensService(db: Db, clock: Clock) {
  return {
    /** Makes a token; the plain text is returned once and only its hash is kept. */
    async create(userId: number, name: string) {
      const token = PREFIX + randomBytes(32).toString('base64url');
      const apiToken = await db.transaction(async (trx) => {
        const now = clock.now();
        const made = await insertToken(trx, { userId, name, hash: hashOf(token), prefix: token.slice(0, 10) }, now);
        // A token acts with its owner's roles in every project, so its entry belongs to no one project.
        await appendTrail(
          trx,
          { projectId: null, actorUserId: userId, action: 'token.created', entityType: 'token', entityId: made.id, after: { name: made.name, prefix: made.prefix } },
          now,
        );
        return made;
      });
      return { token, apiToken };
    },

    list: (userId: number) => listTokens(db, userId),

    async revoke(userId: number, tokenId: number): Promise<void> {
      await db.transaction(async (trx) => {
        const now = clock.now();
        if ((await revokeToken(trx, userId, tokenId, now)) === 0) throw notFound('No such active token.');
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'token.revoked', entityType: 'token', entityId: tokenId }, now);
      });
    },

    /** The owner of a live token, or undefined. */
    async userFor(token: string): Promise<User | undefined> {
      if (!token.startsWith(PREFIX)) return undefined;
      const found = await findTokenOwner(db, hashOf(token));
      if (!found) return undefined;
      await touchToken(db, found.id, clock.now());
      return findUserById(db, found.userId);
    },
  };
}

export type TokensService = ReturnType<typeof createTokensService>;
