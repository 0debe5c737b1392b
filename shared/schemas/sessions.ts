import { z } from 'zod';
import { confirmationFields } from './second-factor';

/**
 * One of a person's signed-in sessions as their account page lists it. The
 * id names the session without being its secret (the cookie's value never
 * leaves the server): see server/modules/auth/sessions.repository.ts.
 */
export const accountSessionSchema = z.object({
  id: z.string(),
  signedInAt: z.string(),
  lastSeenAt: z.string(),
  /** "Firefox 133 on Linux", read from the user agent; null when it names no browser. */
  browser: z.string().nullable(),
  userAgent: z.string().nullable(),
  address: z.string().nullable(),
  /** The session this request came with. */
  current: z.boolean(),
});
export type AccountSession = z.infer<typeof accountSessionSchema>;

/** The sessions, and how long any session lasts (the server's SESSION_MAX_HOURS and SESSION_IDLE_MINUTES). */
export const accountSessionsResponse = z.object({ sessions: z.array(accountSessionSchema), limits: z.object({ maxHours: z.number(), idleMinutes: z.number() }) });
export type AccountSessionsResponse = z.infer<typeof accountSessionsResponse>;

export const sessionParams = z.object({ sessionId: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, 'Not a session id.') });

/** Ending a session, or all the others, is confirmed with the password or a code (ASVS 3.3.4; server/middleware/confirmation.ts). */
export const endSessionBody = z.object({ ...confirmationFields });
export type EndSessionBody = z.infer<typeof endSessionBody>;
