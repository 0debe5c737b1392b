import { createHash } from 'node:crypto';
import Bowser from 'bowser';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { notFound } from '../../lib/errors';
import type { AccountSession } from '../../../shared/schemas/sessions';
import { deleteSessions, deleteSessionsOf, findSessionDetails, listSessionDetailsOf, recordSignIn, stampLastSeen, type SessionDetails } from './sessions.repository';

/**
 * How long a signed-in session lasts (ASVS 4.0.3 3.3.2, level 2: sign in
 * again after at most 12 hours, or 30 minutes without use): SESSION_MAX_HOURS
 * from sign-in whatever happens, and SESSION_IDLE_MINUTES from its last use.
 */
export interface SessionLimits {
  maxHours: number;
  idleMinutes: number;
}

export const defaultSessionLimits: SessionLimits = { maxHours: 12, idleMinutes: 30 };

/**
 * A session's last use is written at most this often, as a token's is: a
 * page that polls would otherwise make every read a write. The idle limit
 * therefore counts from up to a minute before the real last use, so a
 * session may end up to a minute early, never late.
 */
export const LAST_SEEN_EVERY_MS = 60_000;

/** The name a session goes by in its owner's list: derived from its id, so the list never hands out the cookie's secret. */
export function publicSessionId(sid: string): string {
  return createHash('sha256').update(sid).digest('base64url').slice(0, 22);
}

/** "Firefox 133 on Linux" from a user agent; null when it names no browser. */
export function browserSummary(userAgent: string | null): string | null {
  if (!userAgent) return null;
  const parsed = Bowser.parse(userAgent);
  const name = parsed.browser.name;
  if (!name) return null;
  const major = parsed.browser.version?.split('.')[0];
  const os = parsed.os.name;
  return `${name}${major ? ` ${major}` : ''}${os ? ` on ${os}` : ''}`;
}

function hours(n: number): string {
  return `${n} hour${n === 1 ? '' : 's'}`;
}
function minutes(n: number): string {
  return `${n} minute${n === 1 ? '' : 's'}`;
}

export function createSessionsService(db: Db, clock: Clock, limits: SessionLimits = defaultSessionLimits) {
  const maxMs = limits.maxHours * 3_600_000;
  const idleMs = limits.idleMinutes * 60_000;

  /** Why a session has ended by now, in words for its owner; null while it lasts. A session with no sign-in time (made before they were kept) has ended. */
  function endedBecause(d: SessionDetails, now: Date): string | null {
    if (!d.signedInAt || !d.lastSeenAt) return 'Your session has ended. Sign in again.';
    if (now.getTime() - Date.parse(d.signedInAt) >= maxMs) return `Your session ended ${hours(limits.maxHours)} after you signed in. Sign in again.`;
    if (now.getTime() - Date.parse(d.lastSeenAt) >= idleMs) return `Your session ended after ${minutes(limits.idleMinutes)} without use. Sign in again.`;
    return null;
  }

  async function liveSessionsOf(userId: number): Promise<SessionDetails[]> {
    const now = clock.now();
    return (await listSessionDetailsOf(db, userId)).filter((d) => endedBecause(d, now) === null);
  }

  return {
    limits,

    recordSignIn: (sid: string, d: { userId: number; userAgent: string | null; address: string | null }) => recordSignIn(db, sid, { ...d, at: clock.now() }),

    /**
     * Checks a signed-in request's session against the limits: the reason in
     * words when it has ended (the caller ends it), otherwise null, and its
     * last use is stamped (at most once a minute, skipped when the database is busy).
     */
    async check(sid: string): Promise<string | null> {
      const d = await findSessionDetails(db, sid);
      const now = clock.now();
      if (!d) return 'Your session has ended. Sign in again.';
      const ended = endedBecause(d, now);
      if (ended) return ended;
      if (now.getTime() - Date.parse(d.lastSeenAt!) >= LAST_SEEN_EVERY_MS) await stampLastSeen(db, sid, now);
      return null;
    },

    /** The person's sessions that still last, the one in use first, then by last use. */
    async list(userId: number, currentSid: string): Promise<AccountSession[]> {
      const sessions = (await liveSessionsOf(userId)).map((d) => ({
        id: publicSessionId(d.sid),
        signedInAt: d.signedInAt!,
        lastSeenAt: d.lastSeenAt!,
        browser: browserSummary(d.userAgent),
        userAgent: d.userAgent,
        address: d.address,
        current: d.sid === currentSid,
      }));
      return sessions.sort((a, b) => Number(b.current) - Number(a.current) || b.lastSeenAt.localeCompare(a.lastSeenAt));
    },

    /** Ends one of the person's sessions by its listed id; whether it was the one in use. */
    async end(userId: number, id: string, currentSid: string): Promise<{ wasCurrent: boolean }> {
      const found = (await listSessionDetailsOf(db, userId)).find((d) => publicSessionId(d.sid) === id);
      if (!found) throw notFound('No such session of yours; it may have ended already.');
      await deleteSessions(db, [found.sid]);
      return { wasCurrent: found.sid === currentSid };
    },

    /** Ends every session of the person but the one in use; how many. */
    endOthers: (userId: number, currentSid: string) => deleteSessionsOf(db, userId, { except: currentSid }),
  };
}

export type SessionsService = ReturnType<typeof createSessionsService>;
