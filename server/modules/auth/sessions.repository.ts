import type { Db } from '../../db/knex';
import type { StoredSessionUser } from '../../middleware/auth';

/**
 * Ends every session of one account. express-session keeps each session as
 * JSON in `sessions.sess`, with passport's user at `passport.user` (the id
 * and a password stamp, see middleware/auth.ts); the JSON is read here
 * rather than in SQL so that SQLite and PostgreSQL run the same code.
 */
export async function deleteSessionsOf(db: Db, userId: number): Promise<number> {
  const rows: { sid: string; sess: unknown }[] = await db('sessions').select('sid', 'sess');
  const sids = rows
    .filter((r) => {
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
