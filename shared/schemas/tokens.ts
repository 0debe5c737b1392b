import { z } from 'zod';
import { confirmationFields } from './second-factor';

/** The lifetimes a new token may be given, in days; it is refused once its lifetime has passed (ASVS 3.5.2). */
export const TOKEN_LIFETIMES_DAYS = [30, 90, 365] as const;
export const DEFAULT_TOKEN_LIFETIME_DAYS = 90;

export const createTokenBody = z.object({
  name: z.string().trim().min(1, 'Name the token after what will use it.').max(80, 'Use at most 80 characters.'),
  lifetimeDays: z.literal(TOKEN_LIFETIMES_DAYS, { error: 'Choose 30, 90 or 365 days.' }).default(DEFAULT_TOKEN_LIFETIME_DAYS),
  // A token acts as its owner: making one is confirmed with the password or a code (ASVS 3.7.1).
  ...confirmationFields,
});
export type CreateTokenBody = z.infer<typeof createTokenBody>;

export const apiTokenSchema = z.object({
  id: z.number(),
  name: z.string(),
  prefix: z.string(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  /** After this the token is refused. */
  expiresAt: z.string(),
  /** Whether expiresAt has passed, by the server's clock. */
  expired: z.boolean(),
  revokedAt: z.string().nullable(),
});
export type ApiToken = z.infer<typeof apiTokenSchema>;
