import { z } from 'zod';
import { projectRole } from './roles';
import { mailPreferenceSchema } from './mail';
import { trailEntrySchema } from './trail';

/**
 * The file a person downloads of what Starledger holds about them (ASVS
 * 8.3.2; docs/data-protection.md lists the data). No password hash,
 * one-time password secret, recovery code, token hash or session id is in
 * it: those are credentials, not data about the person, and a copy of the
 * file must open nothing.
 */
export const accountExportSchema = z.object({
  /** What the file is and who made it, so it can be told apart from others. */
  format: z.literal('starledger-account-export'),
  version: z.literal(1),
  /** UTC, ISO 8601, by the server's clock. */
  exportedAt: z.string(),
  account: z.object({
    id: z.number(),
    email: z.string(),
    name: z.string(),
    isSiteAdmin: z.boolean(),
    secondFactor: z.boolean(),
  }),
  memberships: z.array(z.object({ projectId: z.number(), projectCode: z.string(), projectName: z.string(), role: projectRole })),
  /** The sessions signed in now: when, from which browser and address. */
  sessions: z.array(z.object({ signedInAt: z.string(), lastSeenAt: z.string(), browser: z.string().nullable(), userAgent: z.string().nullable(), address: z.string().nullable(), current: z.boolean() })),
  mailPreferences: z.array(mailPreferenceSchema),
  /** Personal API tokens by name and dates; never the token or its hash. */
  tokens: z.array(z.object({ name: z.string(), createdAt: z.string(), lastUsedAt: z.string().nullable(), expiresAt: z.string(), revokedAt: z.string().nullable() })),
  /** Trail entries the person made, or that are about their account, oldest first. */
  trail: z.array(trailEntrySchema.extend({ projectCode: z.string().nullable() })),
});
export type AccountExport = z.infer<typeof accountExportSchema>;

/** The name the file is saved under: the UTC date it was made. */
export function accountExportFilename(at: Date): string {
  return `starledger-account-${at.toISOString().slice(0, 10)}.json`;
}
