import { writeUnlessBusy, type Db } from '../../db/knex';
import type { ApiToken } from '../../../shared/schemas/tokens';
import { toIso } from '../../lib/rows';

interface TokenRow {
  id: number;
  user_id: number;
  name: string;
  prefix: string;
  created_at: unknown;
  last_used_at: unknown;
  expires_at: unknown;
  revoked_at: unknown;
}

/** A token as stored; whether it has expired is the service's to say, by its clock. */
export type StoredToken = Omit<ApiToken, 'expired'>;

function toToken(row: TokenRow): StoredToken {
  return {
    id: row.id,
    name: row.name,
    prefix: row.prefix,
    createdAt: toIso(row.created_at),
    lastUsedAt: row.last_used_at == null ? null : toIso(row.last_used_at),
    expiresAt: toIso(row.expires_at),
    revokedAt: row.revoked_at == null ? null : toIso(row.revoked_at),
  };
}

export async function insertToken(db: Db, t: { userId: number; name: string; hash: string; prefix: string; expiresAt: Date }, at: Date): Promise<StoredToken> {
  const [row] = await db('api_tokens')
    .insert({ user_id: t.userId, name: t.name, token_hash: t.hash, prefix: t.prefix, created_at: at.toISOString(), expires_at: t.expiresAt.toISOString() })
    .returning('*');
  return toToken(row);
}

export async function listTokens(db: Db, userId: number): Promise<StoredToken[]> {
  return (await db<TokenRow>('api_tokens').where({ user_id: userId }).orderBy('id', 'desc')).map(toToken);
}

/** A live (not revoked) token by its hash, with its expiry; whether that has passed is the service's to judge. */
export async function findTokenOwner(db: Db, hash: string): Promise<{ id: number; userId: number; expiresAt: string | null } | undefined> {
  const row = await db('api_tokens').where({ token_hash: hash }).whereNull('revoked_at').first('id', 'user_id', 'expires_at');
  return row ? { id: row.id, userId: row.user_id, expiresAt: row.expires_at == null ? null : toIso(row.expires_at) } : undefined;
}

/** Stamps a token's last use unless the database is busy; returns whether it did. */
export function touchToken(db: Db, id: number, at: Date): Promise<boolean> {
  return writeUnlessBusy(db, 'update api_tokens set last_used_at = ? where id = ?', [at.toISOString(), id]);
}

export async function revokeToken(db: Db, userId: number, id: number, at: Date): Promise<number> {
  return db('api_tokens').where({ id, user_id: userId }).whereNull('revoked_at').update({ revoked_at: at.toISOString() });
}
