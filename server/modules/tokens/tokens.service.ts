import { createHash, randomBytes } from 'node:crypto';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { User } from '../../../shared/schemas/auth';
import { notFound } from '../../lib/errors';
import { findUserById } from '../users/users.repository';
import { findTokenOwner, insertToken, listTokens, revokeToken, touchToken } from './tokens.repository';

const PREFIX = 'slt_';
const hashOf = (token: string) => createHash('sha256').update(token).digest('hex');

export function createTokensService(db: Db, clock: Clock) {
  return {
    /** Makes a token; the plain text is returned once and only its hash is kept. */
    async create(userId: number, name: string) {
      const token = PREFIX + randomBytes(32).toString('base64url');
      const apiToken = await insertToken(db, { userId, name, hash: hashOf(token), prefix: token.slice(0, 10) }, clock.now());
      return { token, apiToken };
    },

    list: (userId: number) => listTokens(db, userId),

    async revoke(userId: number, tokenId: number): Promise<void> {
      if ((await revokeToken(db, userId, tokenId, clock.now())) === 0) throw notFound('No such active token.');
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
