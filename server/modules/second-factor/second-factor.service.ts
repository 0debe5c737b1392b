import { createCipheriv, createDecipheriv, createHash, createHmac, randomBytes, randomInt, timingSafeEqual } from 'node:crypto';
import { Secret, TOTP } from 'otpauth';
import QRCode from 'qrcode';
import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { User } from '../../../shared/schemas/auth';
import { RECOVERY_CODE_COUNT, type SecondFactorEnrolment } from '../../../shared/schemas/second-factor';
import { AppError, conflict, validationFailed } from '../../lib/errors';
import { appendTrail } from '../trail/trail.repository';

/** RFC 6238's defaults, which every authenticator app reads: HMAC-SHA-1, 6 digits, 30-second steps. */
const PERIOD_SECONDS = 30;
const ISSUER = 'Starledger';
/** A code of the step before or after the server's is taken too, for a phone's clock a little off. */
const WINDOW = 1;

/** A correct password waits this long for its code; then the sign-in starts again. */
export const PENDING_MINUTES = 5;

export type CodeCheck = 'ok' | 'wrong' | 'used';

/**
 * Sealing a secret: AES-256-GCM under a key derived from SECOND_FACTOR_KEY,
 * a fresh 12-byte IV each time; "v1.iv.tag.ciphertext" in base64url.
 */
function sealer(keyText: string) {
  const key = createHash('sha256').update(`starledger second factor\0${keyText}`).digest();
  return {
    seal(plain: string): string {
      const iv = randomBytes(12);
      const cipher = createCipheriv('aes-256-gcm', key, iv);
      const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
      return ['v1', iv, cipher.getAuthTag(), body].map((p) => (typeof p === 'string' ? p : p.toString('base64url'))).join('.');
    },
    /** The secret again; a secret sealed under another key (SECOND_FACTOR_KEY changed or lost) is a 503 that says so, not a 500. */
    open(sealed: string): string {
      const [version, iv, tag, body] = sealed.split('.');
      if (version !== 'v1' || !iv || !tag || !body) throw new Error('unknown sealed secret format');
      const decipher = createDecipheriv('aes-256-gcm', key, Buffer.from(iv, 'base64url'));
      decipher.setAuthTag(Buffer.from(tag, 'base64url'));
      try {
        return Buffer.concat([decipher.update(Buffer.from(body, 'base64url')), decipher.final()]).toString('utf8');
      } catch {
        // GCM's tag check is what fails when the key is another one (NIST SP 800-38D, 7.2).
        throw new AppError(503, 'second_factor_key_mismatch');
      }
    },
    /**
     * A recovery code's keyed hash with its own random salt (ASVS 2.6.2: under
     * 112 bits a lookup secret is salted, 32 bits, and hashed): a copy of the
     * database alone does not give it, nor one hash test every account's codes.
     * A code made before salts had none (salt '').
     */
    hash(code: string, salt: string): string {
      return createHmac('sha256', key).update(salt === '' ? code : `${salt}\0${code}`).digest('hex');
    },
  };
}

export const totpFor = (base32: string, label: string) => new TOTP({ issuer: ISSUER, label, algorithm: 'SHA1', digits: 6, period: PERIOD_SECONDS, secret: Secret.fromBase32(base32) });

/** What a recovery code is once spaces, dashes and case are set aside. */
const normalRecovery = (code: string) => code.toUpperCase().replace(/[\s-]+/g, '');
/** Crockford-like letters and digits without 0/O and 1/I/L, so a code read off paper is typed right. */
const RECOVERY_ALPHABET = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789';

function newRecoveryCode(): string {
  const chars = Array.from({ length: 10 }, () => RECOVERY_ALPHABET[randomInt(RECOVERY_ALPHABET.length)]).join('');
  return `${chars.slice(0, 5)}-${chars.slice(5)}`;
}

/**
 * The second factor (ASVS 2.3.2, 2.8): an RFC 6238 time-based one-time
 * password, enrolled by scanning a QR code (or typing its secret) and
 * confirmed with a current code, plus ten single-use recovery codes shown
 * once. The secret is stored encrypted (`key`, from SECOND_FACTOR_KEY, not in
 * the database). A code is taken once: the account keeps the time step of
 * the last one taken, and a code of that step or an earlier one is refused
 * (2.8.4), in one conditional update so that two requests at once cannot
 * both take it.
 */
export function createSecondFactorService(db: Db, clock: Clock, key: string) {
  const sealed = sealer(key);
  const stepNow = () => Math.floor(clock.now().getTime() / 1000 / PERIOD_SECONDS);

  async function secretsOf(userId: number) {
    const row = await db('users').where({ id: userId }).first('email', 'totp_secret', 'totp_pending_secret');
    return { email: row?.email as string, secret: row?.totp_secret ? sealed.open(row.totp_secret) : null, pending: row?.totp_pending_secret ? sealed.open(row.totp_pending_secret) : null };
  }

  /** The step a code belongs to, when it is one of the window around now; null otherwise. */
  function stepOf(base32: string, email: string, code: string): number | null {
    const token = code.replace(/\s+/g, '');
    if (!/^\d{6}$/.test(token)) return null;
    const delta = totpFor(base32, email).validate({ token, timestamp: clock.now().getTime(), window: WINDOW });
    return delta === null ? null : stepNow() + delta;
  }

  /** Takes the step for the account unless a code of it (or a later one) was taken already. */
  async function takeStep(userId: number, step: number): Promise<boolean> {
    const taken = await db('users')
      .where({ id: userId })
      .andWhere((q) => q.whereNull('totp_last_step').orWhere('totp_last_step', '<', step))
      .update({ totp_last_step: step });
    return taken === 1;
  }

  return {
    /** The time a session's step of sign-in is marked with, by the app's clock. */
    stamp: () => clock.now().toISOString(),
    /** Whether a correct password marked at `at` still waits for its code (PENDING_MINUTES). */
    stillPending: (at: string) => clock.now().getTime() - Date.parse(at) <= PENDING_MINUTES * 60_000,

    /** How many recovery codes are left unused. */
    async recoveryCodesLeft(userId: number): Promise<number> {
      const [{ n }] = await db('recovery_codes').where({ user_id: userId }).whereNull('used_at').count({ n: '*' });
      return Number(n);
    },

    /** A new secret to enrol, kept (encrypted) beside the account until a code confirms it; any earlier unconfirmed one is replaced. */
    async begin(user: User): Promise<SecondFactorEnrolment> {
      if (user.secondFactor) throw conflict('The second factor is on already. Turn it off first to enrol another device.');
      const secret = new Secret({ size: 20 }).base32;
      await db('users').where({ id: user.id }).update({ totp_pending_secret: sealed.seal(secret) });
      const uri = totpFor(secret, user.email).toString();
      const qrCode = await QRCode.toString(uri, { type: 'svg', errorCorrectionLevel: 'M', margin: 2 });
      return { secret, uri, qrCode: `data:image/svg+xml;base64,${Buffer.from(qrCode).toString('base64')}` };
    },

    /**
     * A current code from the secret being enrolled turns the second factor
     * on; ten recovery codes are made and returned (once: only their hashes
     * are kept). One transaction.
     */
    async confirm(userId: number, code: string): Promise<string[]> {
      const { email, pending, secret } = await secretsOf(userId);
      if (secret) throw conflict('The second factor is on already.');
      if (!pending) throw validationFailed([{ path: 'code', message: 'Start again: no enrolment is waiting for its code.' }]);
      const step = stepOf(pending, email, code);
      if (step === null) throw validationFailed([{ path: 'code', message: 'This is not the current code of the secret shown. Check the device’s clock and type the six digits it shows now.' }]);
      const codes = Array.from({ length: RECOVERY_CODE_COUNT }, newRecoveryCode);
      const now = clock.now().toISOString();
      await db.transaction(async (trx) => {
        await trx('users').where({ id: userId }).update({ totp_secret: sealed.seal(pending), totp_pending_secret: null, totp_enabled_at: now, totp_last_step: step });
        await trx('recovery_codes').where({ user_id: userId }).delete();
        await trx('recovery_codes').insert(
          codes.map((c) => {
            const salt = randomBytes(4).toString('hex');
            return { user_id: userId, salt, code_hash: sealed.hash(normalRecovery(c), salt), created_at: now };
          }),
        );
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'user.second_factor_on', entityType: 'user', entityId: userId, after: { recoveryCodes: codes.length } }, clock.now());
      });
      return codes;
    },

    /**
     * Checks a code of an account whose second factor is on: six digits are a
     * one-time password (taken once), anything else a recovery code (used up)
     * when `recovery` allows it.
     */
    async check(userId: number, code: string, options: { recovery: boolean }): Promise<CodeCheck> {
      const { email, secret } = await secretsOf(userId);
      if (!secret) return 'wrong';
      if (/^\s*\d{6}\s*$/.test(code)) {
        const step = stepOf(secret, email, code);
        if (step === null) return 'wrong';
        return (await takeStep(userId, step)) ? 'ok' : 'used';
      }
      if (!options.recovery) return 'wrong';
      // Each unused code is hashed with its own salt (ten at most); the one that matches is used up by one conditional update.
      const typed = normalRecovery(code);
      const unused: { id: number; salt: string | null; code_hash: string }[] = await db('recovery_codes').where({ user_id: userId }).whereNull('used_at').select('id', 'salt', 'code_hash');
      const match = unused.find((row) => timingSafeEqual(Buffer.from(sealed.hash(typed, row.salt ?? ''), 'hex'), Buffer.from(row.code_hash, 'hex')));
      if (!match) return 'wrong';
      const used = await db('recovery_codes').where({ id: match.id }).whereNull('used_at').update({ used_at: clock.now().toISOString() });
      return used === 1 ? 'ok' : 'wrong';
    },

    /** Turns the second factor off (the caller has had the password and a code) and drops the recovery codes; one transaction. */
    async turnOff(userId: number): Promise<void> {
      await db.transaction(async (trx) => {
        await trx('users').where({ id: userId }).update({ totp_secret: null, totp_pending_secret: null, totp_enabled_at: null, totp_last_step: null });
        await trx('recovery_codes').where({ user_id: userId }).delete();
        await appendTrail(trx, { projectId: null, actorUserId: userId, action: 'user.second_factor_off', entityType: 'user', entityId: userId, after: {} }, clock.now());
      });
    },
  };
}

export type SecondFactorService = ReturnType<typeof createSecondFactorService>;
