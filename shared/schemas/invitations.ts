import { z } from 'zod';
import { linkToken, passwordRule } from './auth';
import { projectRole } from './roles';

export const createInvitationBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  role: projectRole,
});
export type CreateInvitationBody = z.infer<typeof createInvitationBody>;

/** A pending invitation, as the lead astronomer sees it on the members page. */
export const invitationSchema = z.object({
  id: z.number(),
  email: z.string(),
  role: projectRole,
  invitedByName: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
});
export type Invitation = z.infer<typeof invitationSchema>;

/** What the person holding a valid link is shown before accepting. */
export const invitationLookup = z.object({
  projectName: z.string(),
  projectCode: z.string(),
  email: z.string(),
  role: projectRole,
  invitedByName: z.string().nullable(),
  expiresAt: z.string(),
  /** An account with the invited address exists: accepting needs signing in as it, not a new password. */
  accountExists: z.boolean(),
});
export type InvitationLookup = z.infer<typeof invitationLookup>;

/** What a new account chooses when accepting: a name and a password under the account rules. */
export const newAccountFields = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
  password: passwordRule,
});

/**
 * Accepting. A new account needs a name and a password; for an existing
 * account both are left out and the signed-in person must be its owner.
 */
export const acceptInvitationBody = newAccountFields.partial().extend({ token: linkToken });
export type AcceptInvitationBody = z.infer<typeof acceptInvitationBody>;
