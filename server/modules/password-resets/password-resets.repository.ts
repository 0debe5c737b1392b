import type { Db } from '../../db/knex';
import { toIso } from '../../lib/rows';

export interface StoredReset {
  id: number;
  userId: number;
  email: string;
  expiresAt: string;
  usedAt: string | null;
}

interface ResetRow {
  id: number;
  user_id: number;
  email: string;
  expires_at: unknown;
  used_at: unknown;
}

export async function insertReset(db: Db, reset: { userId: number; tokenHash: string; expiresAt: Date }, at: Date): Promise<number> {
  const [row] = await db('password_resets')
    .insert({ user_id: reset.userId, token_hash: reset.tokenHash, expires_at: reset.expiresAt.toISOString(), created_at: at.toISOString() })
    .returning('id');
  return (row as { id: number }).id;
}

export async function findResetByHash(db: Db, tokenHash: string): Promise<StoredReset | undefined> {
  const row = (await db('password_resets as r').join('users as u', 'u.id', 'r.user_id').where('r.token_hash', tokenHash).select('r.*', 'u.email').first()) as
    | ResetRow
    | undefined;
  return row ? { id: row.id, userId: row.user_id, email: row.email, expiresAt: toIso(row.expires_at), usedAt: row.used_at == null ? null : toIso(row.used_at) } : undefined;
}

/** Uses the link: a compare-and-set, so that of two submissions of one link exactly one sets a password. */
export async function claimReset(db: Db, id: number, at: Date): Promise<boolean> {
  const n = await db('password_resets').where({ id }).whereNull('used_at').where('expires_at', '>', at.toISOString()).update({ used_at: at.toISOString() });
  return n === 1;
}

/** Every other unused link of the account stops working once its password has been set. */
export async function closeOpenResets(db: Db, userId: number, at: Date): Promise<void> {
  await db('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: at.toISOString() });
}
