import { createHash, createHmac, randomBytes, scrypt as scryptCb, timingSafeEqual, type BinaryLike, type ScryptOptions } from 'node:crypto';
import commonPasswords from 'fxa-common-password-list';
import { contextualPasswordProblem, passwordRule, type PasswordContext } from '../../shared/schemas/auth';
import { validationFailed } from './errors';

function scrypt(password: BinaryLike, salt: Buffer, keylen: number, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scryptCb(password, salt, keylen, options, (err, key) => (err ? reject(err) : resolve(key))),
  );
}

/** scrypt's cost parameters as RFC 7914 names them: N (a power of two), r and p. */
export interface ScryptCost {
  N: number;
  r: number;
  p: number;
}

// N = 2^15, r = 8, p = 1: OWASP's scrypt minimum is N = 2^17 with r = 8 for
// interactive logins (common practice); 2^15 keeps one hash near 70 ms on a
// 2-core server (73 ms measured here, unloaded). The parameters are stored
// with each hash so they can rise later.
export const PRODUCTION_COST: ScryptCost = { N: 2 ** 15, r: 8, p: 1 };

/**
 * The cost new hashes are made with in a process of this environment:
 * PRODUCTION_COST, except in the test runner (NODE_ENV=test, which Vitest
 * sets), where STARLEDGER_TEST_SCRYPT_N may lower N so that its hundreds of
 * sign-ins do not each spend about 70 ms of CPU, 160 ms while the machine is
 * busy (vitest.config.ts). A server, whatever else it is told, never hashes
 * below PRODUCTION_COST.
 */
export function hashCostFor(env: NodeJS.ProcessEnv): ScryptCost {
  const testN = Number(env.STARLEDGER_TEST_SCRYPT_N);
  if (env.NODE_ENV !== 'test' || !Number.isInteger(Math.log2(testN)) || testN < 2 || testN > PRODUCTION_COST.N) return PRODUCTION_COST;
  return { ...PRODUCTION_COST, N: testN };
}

const { N, r, p } = hashCostFor(process.env);
const KEYLEN = 32;

/**
 * The scheme a hash was made with, stored first in it: `scrypt` of the
 * password itself, or `scrypt-hmac` of HMAC-SHA-256(pepper, password), where
 * the pepper is a secret kept apart from the database (PASSWORD_PEPPER, or
 * a file under DATA_DIR: server/config.ts; ASVS 4.0 2.4.5). A stolen
 * database alone then cannot be guessed against.
 */
type Scheme = 'scrypt' | 'scrypt-hmac';

function schemeFor(pepper: string | undefined): Scheme {
  return pepper ? 'scrypt-hmac' : 'scrypt';
}

function peppered(password: string, scheme: Scheme, pepper: string | undefined): BinaryLike | undefined {
  if (scheme === 'scrypt') return password;
  return pepper ? createHmac('sha256', pepper).update(password, 'utf8').digest() : undefined;
}

/** A new hash of the password: with the pepper when there is one. */
export async function hashPassword(password: string, pepper?: string): Promise<string> {
  const scheme = schemeFor(pepper);
  const salt = randomBytes(16);
  const key = await scrypt(peppered(password, scheme, pepper)!, salt, KEYLEN, { N, r, p, maxmem: 64 * 1024 * 1024 });
  return `${scheme}$${N}$${r}$${p}$${salt.toString('base64')}$${key.toString('base64')}`;
}

/** Whether the password matches the stored hash, of either scheme; a peppered hash never matches without its pepper. */
export async function verifyPassword(password: string, stored: string, pepper?: string): Promise<boolean> {
  const [scheme, n, rr, pp, saltB64, keyB64] = stored.split('$');
  if ((scheme !== 'scrypt' && scheme !== 'scrypt-hmac') || !saltB64 || !keyB64) return false;
  const input = peppered(password, scheme, pepper);
  if (!input) return false;
  const expected = Buffer.from(keyB64, 'base64');
  const key = await scrypt(input, Buffer.from(saltB64, 'base64'), expected.length, {
    N: Number(n),
    r: Number(rr),
    p: Number(pp),
    maxmem: 64 * 1024 * 1024,
  });
  return timingSafeEqual(key, expected);
}

/** Whether a hash that just matched should be made again: its scheme or parameters are older than hashPassword's now (it is, at the next sign-in). */
export function needsRehash(stored: string, pepper?: string): boolean {
  const [scheme, n, rr, pp] = stored.split('$');
  return scheme !== schemeFor(pepper) || Number(n) !== N || Number(rr) !== r || Number(pp) !== p;
}

/** A hash of a random password, compared against when the e-mail is unknown so that timing does not reveal which accounts exist. */
export const decoyHash = hashPassword(randomBytes(16).toString('hex'));

/**
 * What a session remembers of the password it was opened with: 16 hex
 * digits of a SHA-256 of the stored hash (whose salt is new at every
 * change). A session whose stamp no longer matches ends, so a new password
 * ends every earlier session even if one of them is written back to the
 * store by a request in flight.
 */
export function sessionStamp(passwordHash: string): string {
  return createHash('sha256').update(passwordHash).digest('hex').slice(0, 16);
}

/**
 * Why a new password is refused, or undefined when it is acceptable: the
 * length (shared passwordRule), one of the most common passwords (Mozilla's
 * fxa-common-password-list, drawn from the OWASP SecLists "10 million
 * passwords" top list; ASVS 4.0 2.1.7), or one made of the account's own
 * words (contextualPasswordProblem). The one check every way of setting a
 * password passes through: a new account, an invitation, a reset, a change.
 */
export function passwordProblem(password: string, context: PasswordContext): string | undefined {
  const length = passwordRule.safeParse(password);
  if (!length.success) return length.error.issues[0]?.message;
  if (commonPasswords.test(password) || commonPasswords.test(password.toLowerCase())) {
    return 'This is one of the most common passwords, which are tried first. Choose another; a few unrelated words together make a strong one.';
  }
  return contextualPasswordProblem(password, context);
}

/** Throws a validation error on the form's password field when passwordProblem finds one. */
export function assertAcceptablePassword(password: string, context: PasswordContext, field = 'password'): void {
  const problem = passwordProblem(password, context);
  if (problem) throw validationFailed([{ path: field, message: problem }]);
}
