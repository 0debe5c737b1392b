import { writeUnlessBusy, type Db } from '../../db/knex';
import { toIso } from '../../lib/rows';
import type { StoredSessionUser } from '../../middleware/auth';

/**
 * Ends every session of one account (but `except`, the one in use, when given). express-session keeps each session as
 * JSON in `sessions.sess`, with passport's user at `passport.user` (the id
 * and a password stamp, see middleware/auth.ts); the JSON is read here
 * rather than in SQL so that SQLite and PostgreSQL run the same code.
 */
export async function deleteSessionsOf(db: Db, userId: number, options: { except?: string } = {}): Promise<number> {
  const rows: { sid: string; sess: unknown }[] = await db('sessions').select('sid', 'sess');
  const sids = rows
    .filter((r) => {
      if (r.sid === options.except) return false;
      try {
        const sess = (typeof r.sess === 'string' ? JSON.parse(r.sess) : r.sess) as { passport?: { user?: StoredSessionUser | number } };
        const stored = sess?.passport?.user;
        return (typeof stored === 'number' ? stored : stored?.id) === userId;
      } catch {
        return false;
      }
    })
    .map((r) => r.sid);
  if (sids.length === 0) return 0;
  return db('sessions').whereIn('sid', sids).delete();
}

/** What a session row says of itself beyond express-session's own columns (sid, sess, expired). */
export interface SessionDetails {
  sid: string;
  userId: number | null;
  signedInAt: string | null;
  lastSeenAt: string | null;
  userAgent: string | null;
  address: string | null;
}

interface SessionDetailsRow {
  sid: string;
  user_id: number | null;
  signed_in_at: unknown;
  last_seen_at: unknown;
  user_agent: string | null;
  address: string | null;
}

const DETAIL_COLUMNS = ['sid', 'user_id', 'signed_in_at', 'last_seen_at', 'user_agent', 'address'] as const;

function toDetails(row: SessionDetailsRow): SessionDetails {
  return {
    sid: row.sid,
    userId: row.user_id,
    signedInAt: row.signed_in_at == null ? null : toIso(row.signed_in_at),
    lastSeenAt: row.last_seen_at == null ? null : toIso(row.last_seen_at),
    userAgent: row.user_agent,
    address: row.address,
  };
}

/** Marks a session just made at sign-in: whose it is, when, and from which browser and address. */
export async function recordSignIn(db: Db, sid: string, d: { userId: number; at: Date; userAgent: string | null; address: string | null }): Promise<void> {
  const at = d.at.toISOString();
  await db('sessions').where({ sid }).update({ user_id: d.userId, signed_in_at: at, last_seen_at: at, user_agent: d.userAgent, address: d.address });
}

export async function findSessionDetails(db: Db, sid: string): Promise<SessionDetails | undefined> {
  const row: SessionDetailsRow | undefined = await db('sessions').where({ sid }).first(...DETAIL_COLUMNS);
  return row ? toDetails(row) : undefined;
}

/** Stamps a session's last use unless the database is busy (a reader must not wait on a writer's lock); returns whether it did. */
export function stampLastSeen(db: Db, sid: string, at: Date): Promise<boolean> {
  return writeUnlessBusy(db, 'update sessions set last_seen_at = ? where sid = ?', [at.toISOString(), sid]);
}

export async function listSessionDetailsOf(db: Db, userId: number): Promise<SessionDetails[]> {
  const rows: SessionDetailsRow[] = await db('sessions').where({ user_id: userId }).select(...DETAIL_COLUMNS);
  return rows.map(toDetails);
}

export async function deleteSessions(db: Db, sids: string[]): Promise<number> {
  if (sids.length === 0) return 0;
  return db('sessions').whereIn('sid', sids).delete();
}
