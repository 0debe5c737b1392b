import { Secret, TOTP } from 'otpauth';
import { PASSWORD, type Session } from './world';

/**
 * A code of a base32 secret at a moment, made by otpauth apart from the
 * server, as an authenticator app would: RFC 6238's defaults (HMAC-SHA-1,
 * six digits, 30-second steps).
 */
export const codeAt = (secret: string, at: Date) => new TOTP({ secret: Secret.fromBase32(secret), digits: 6, period: 30, algorithm: 'SHA1' }).generate({ timestamp: at.getTime() });

/** Turns the second factor on for a signed-in session with a code of `at` (the app's clock); the secret and the recovery codes. */
export async function enrolSecondFactor(s: Session, at: Date): Promise<{ secret: string; recoveryCodes: string[] }> {
  const setup = await s.agent.post('/api/auth/second-factor/setup').set('X-CSRF-Token', s.csrf).expect(200);
  const secret = setup.body.secret as string;
  const confirmed = await s.agent.post('/api/auth/second-factor/confirm').set('X-CSRF-Token', s.csrf).send({ currentPassword: PASSWORD, code: codeAt(secret, at) }).expect(200);
  return { secret, recoveryCodes: confirmed.body.recoveryCodes as string[] };
}
