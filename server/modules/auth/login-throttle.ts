import type { Request } from 'express';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { toIso } from '../../lib/rows';

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

/** The delay after `failures` failures when `free` of them are free. */
export function delayAfter(failures: number, free: number, rules: ThrottleRules): number {
  if (failures < free) return 0;
  return Math.min(rules.maxDelayMs, rules.firstDelayMs * 2 ** Math.min(failures - free, 40));
}

export function createLoginThrottle(db: Db, clock: Clock, rules: ThrottleRules = defaultThrottleRules) {
  const keysOf = (req: Request, email: string) => ({ account: `account:${email}`, address: `address:${req.ip ?? 'unknown'}` });

  return {
    /** Seconds the account or the address must still wait before a password is even looked at; 0 when none. */
    async waitSeconds(req: Request, email: string): Promise<number> {
      const { account, address } = keysOf(req, email);
      const rows: ThrottleRow[] = await db('login_throttle').whereIn('key', [account, address]).select('*');
      const now = clock.now().getTime();
      const until = Math.max(0, ...rows.map((r) => (r.blocked_until == null ? 0 : Date.parse(toIso(r.blocked_until)))));
      return until > now ? Math.ceil((until - now) / 1000) : 0;
    },

    /** Counts a failure against the account and the address, and sets the delay each has earned; one transaction. */
    async failed(req: Request, email: string): Promise<void> {
      const { account, address } = keysOf(req, email);
      const now = clock.now();
      await db.transaction(async (trx) => {
        for (const [key, free, forgetAfterMs] of [
          [account, rules.accountFreeFailures, rules.accountForgetAfterMs],
          [address, rules.addressFreeFailures, rules.addressForgetAfterMs],
        ] as const) {
          const row = (await trx('login_throttle').where({ key }).first()) as ThrottleRow | undefined;
          const fresh = !row || now.getTime() - Date.parse(toIso(row.last_failure_at)) > forgetAfterMs;
          const failures = (fresh ? 0 : row.failures) + 1;
          const delay = delayAfter(failures, free, rules);
          const values = {
            failures,
            last_failure_at: now.toISOString(),
            blocked_until: delay > 0 ? new Date(now.getTime() + delay).toISOString() : null,
          };
          if (row) await trx('login_throttle').where({ key }).update(values);
          // Two first failures at once on PostgreSQL both find no row: the later one merges rather than fails.
          else await trx('login_throttle').insert({ key, ...values }).onConflict('key').merge();
        }
      });
    },

    /** A correct password clears the account's count (not the address's: one good account must not excuse guesses at others). */
    async succeeded(_req: Request, email: string): Promise<void> {
      await db('login_throttle').where({ key: `account:${email}` }).delete();
    },
  };
}

export type LoginThrottle = ReturnType<typeof createLoginThrottle>;
