import { createHash, randomBytes } from 'node:crypto';

/** SHA-256 of a link's token: what the database keeps, so that a copy of it opens nothing. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A fresh 256-bit token for a single-use link, with the hash to store. */
export function newLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashLinkToken(token) };
}

/** When a link stops working, from when it was made. */
export function expiresAfter(from: Date, ms: number): Date {
  return new Date(from.getTime() + ms);
}

/** Why a single-use link can no longer be used, or null when it can. */
export function linkRefusal(row: { expiresAt: string; usedAt: string | null; revokedAt?: string | null }, now: Date): 'link_used' | 'link_revoked' | 'link_expired' | null {
  if (row.usedAt) return 'link_used';
  if (row.revokedAt) return 'link_revoked';
  if (new Date(row.expiresAt).getTime() <= now.getTime()) return 'link_expired';
  return null;
}

export const UNKNOWN_LINK = 'This link is not known. Open it again from the e-mail and make sure none of it is missing.';
