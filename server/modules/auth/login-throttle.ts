import type { Request, Response } from 'express';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { toIso } from '../../lib/rows';
import { securityLogOf } from '../../lib/security-log';
import { queueThrottleAlert } from './throttle-alert';
import { DEFAULT_PUBLIC_URL } from '../../services';

/**
 * Failed sign-ins slow further attempts, per account and per client
 * address, with a delay that doubles at each failure past a free number
 * (never a lock-out: the delay passes and the owner can try again). The
 * counts are kept in the database (`login_throttle`) so that every app
 * process on it sees them.
 *
 * The account is the e-mail as typed, whether or not an account has it,
 * so that a delay says nothing about which accounts exist. The address is
 * `req.ip`, which follows X-Forwarded-For only from the proxies TRUST_PROXY
 * names (Express `trust proxy`); from anyone else the header is ignored.
 */
export interface ThrottleRules {
  /** Failures on one account before each further one delays the next attempt. */
  accountFreeFailures: number;
  /** Failures from one address (over any accounts) before the same. */
  addressFreeFailures: number;
  /** The first delay; each further failure doubles it. */
  firstDelayMs: number;
  /** The delay grows no further than this. */
  maxDelayMs: number;
  /** An account's count with no failure for this long starts again from nothing. */
  accountForgetAfterMs: number;
  /** The same for an address, sooner: a team behind one proxy should not carry a day's typos. */
  addressForgetAfterMs: number;
}

/**
 * Five free failures per account and twenty per address, then 1 s, 2 s,
 * 4 s … up to 15 minutes; an account's count lasts a day, an address's an
 * hour (ASVS 4.0 2.2.1 asks for throttling that does not lock the owner
 * out and allows no more than 100 failures an hour per account; the
 * numbers are our choice).
 */
export const defaultThrottleRules: ThrottleRules = {
  accountFreeFailures: 5,
  addressFreeFailures: 20,
  firstDelayMs: 1000,
  maxDelayMs: 15 * 60 * 1000,
  accountForgetAfterMs: 24 * 3600 * 1000,
  addressForgetAfterMs: 3600 * 1000,
};

interface ThrottleRow {
  key: string;
  failures: number;
  last_failure_at: unknown;
  blocked_until: unknown;
}

/**
 * How one key is counted: events before each further one delays the next
 * attempt, the first delay (doubling at each further event, up to the
 * most), and how long a key with no event starts again from nothing.
 */
export interface CountRule {
  free: number;
  firstDelayMs: number;
  maxDelayMs: number;
  forgetAfterMs: number;
}

/** The delay after `failures` failures when `free` of them are free. */
/**
 * Rows with no event for this long are deleted when the next event is
 * counted (ASVS 8.3.8): longer than any rule forgets a count (a day at
 * most), so pruning changes no delay.
 */
export const KEEP_COUNTS_MS = 7 * 24 * 3600 * 1000;

export function delayAfter(failures: number, free: number, rules: Pick<CountRule, 'firstDelayMs' | 'maxDelayMs'>): number {
  if (failures < free) return 0;
  return Math.min(rules.maxDelayMs, rules.firstDelayMs * 2 ** Math.min(failures - free, 40));
}

/**
 * Counts kept in `login_throttle` by key, each with the delay it has
 * earned. Sign-in failures are counted here (below), and so are requests
 * for a password reset (password-resets.service.ts), under their own keys.
 */
export function createThrottleCounts(db: Db, clock: Clock) {
  return {
    /** Seconds until none of the keys is delayed any longer; 0 when none is. */
    async waitSeconds(keys: string[]): Promise<number> {
      const rows: ThrottleRow[] = await db('login_throttle').whereIn('key', keys).select('*');
      const now = clock.now().getTime();
      const until = Math.max(0, ...rows.map((r) => (r.blocked_until == null ? 0 : Date.parse(toIso(r.blocked_until)))));
      return until > now ? Math.ceil((until - now) / 1000) : 0;
    },

    /**
     * Counts one event against each key, and sets the delay each has earned; one transaction.
     * The count goes up in one statement (insert, or on the key's row add one, or start again
     * from one when the last event is older than forgetAfterMs), so that events counted at the
     * same moment by several requests or processes each count: on PostgreSQL the second waits
     * for the first's row lock and adds to what the first wrote (read-then-write lost one).
     */
    async count(entries: ReadonlyArray<readonly [key: string, rule: CountRule]>): Promise<Array<{ key: string; failures: number; delayMs: number }>> {
      const now = clock.now();
      return db.transaction(async (trx) => {
        await trx('login_throttle').where('last_failure_at', '<', new Date(now.getTime() - KEEP_COUNTS_MS).toISOString()).delete();
        const counted: Array<{ key: string; failures: number; delayMs: number }> = [];
        for (const [key, rule] of entries) {
          const forgottenBefore = new Date(now.getTime() - rule.forgetAfterMs).toISOString();
          const [row] = await trx('login_throttle')
            .insert({ key, failures: 1, last_failure_at: now.toISOString(), blocked_until: null })
            .onConflict('key')
            .merge({
              failures: trx.raw('case when login_throttle.last_failure_at < ? then 1 else login_throttle.failures + 1 end', [forgottenBefore]),
              last_failure_at: now.toISOString(),
            })
            .returning('failures');
          const delay = delayAfter(row.failures, rule.free, rule);
          await trx('login_throttle')
            .where({ key })
            .update({ blocked_until: delay > 0 ? new Date(now.getTime() + delay).toISOString() : null });
          counted.push({ key, failures: Number(row.failures), delayMs: delay });
        }
        return counted;
      });
    },

    async forget(key: string): Promise<void> {
      await db('login_throttle').where({ key }).delete();
    },
  };
}

export type ThrottleCounts = ReturnType<typeof createThrottleCounts>;

/** `publicUrl` is for the link in the site admins' alert when a delay begins (throttle-alert.ts). */
export function createLoginThrottle(db: Db, clock: Clock, rules: ThrottleRules = defaultThrottleRules, publicUrl: string = DEFAULT_PUBLIC_URL) {
  const counts = createThrottleCounts(db, clock);
  const keysOf = (req: Request, email: string) => ({ account: `account:${email}`, address: `address:${req.ip ?? 'unknown'}` });
  const delays = { firstDelayMs: rules.firstDelayMs, maxDelayMs: rules.maxDelayMs };

  return {
    /** Seconds the account or the address must still wait before a password is even looked at; 0 when none. */
    async waitSeconds(req: Request, email: string): Promise<number> {
      const { account, address } = keysOf(req, email);
      return counts.waitSeconds([account, address]);
    },

    /**
     * Counts a failure against the account and the address, and sets the delay each has earned; one transaction.
     * When a delay is in force for either, the site admins are mailed (at most once an hour for each) and the log says so.
     */
    async failed(req: Request, res: Response, email: string): Promise<void> {
      const { account, address } = keysOf(req, email);
      const counted = await counts.count([
        [account, { free: rules.accountFreeFailures, forgetAfterMs: rules.accountForgetAfterMs, ...delays }],
        [address, { free: rules.addressFreeFailures, forgetAfterMs: rules.addressForgetAfterMs, ...delays }],
      ]);
      for (const { key, failures, delayMs } of counted) {
        if (delayMs === 0) continue;
        const admins = await queueThrottleAlert(db, { subject: key, failures, at: clock.now(), publicUrl });
        if (admins > 0) securityLogOf(req).event(req, res, 'throttle_alert', { subject: key, failures, admins });
      }
    },

    /** A correct password clears the account's count (not the address's: one good account must not excuse guesses at others). */
    async succeeded(_req: Request, email: string): Promise<void> {
      await counts.forget(`account:${email}`);
    },
  };
}

export type LoginThrottle = ReturnType<typeof createLoginThrottle>;
