import { z } from 'zod';
import { projectRole } from './roles';

export const loginBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  password: z.string().min(1, 'Enter your password.'),
});
export type LoginBody = z.infer<typeof loginBody>;

export const userSchema = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  isSiteAdmin: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const membershipSchema = z.object({
  projectId: z.number(),
  role: projectRole,
});

export const meResponse = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
  csrfToken: z.string(),
});
export type MeResponse = z.infer<typeof meResponse>;

export const passwordRule = z.string().min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.');

export const createUserBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  password: passwordRule,
  isSiteAdmin: z.boolean().default(false),
});
export type CreateUserBody = z.infer<typeof createUserBody>;

export const passwordResetRequestBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
});
export type PasswordResetRequestBody = z.infer<typeof passwordResetRequestBody>;

/** The one answer to a reset request, whether or not an account has the address. */
export const passwordResetRequested = z.object({ message: z.string() });

/** The random part of an invitation or reset link (43 base64url characters for 32 bytes). */
export const linkToken = z.string().trim().regex(/^[A-Za-z0-9_-]{20,100}$/, 'The link is incomplete. Open it again from the e-mail, or copy all of it.');

/** An invitation or reset link's token, sent in the body so that it stays out of request logs. */
export const linkBody = z.object({ token: linkToken });
export type LinkBody = z.infer<typeof linkBody>;

export const passwordResetLookup = z.object({ email: z.string(), expiresAt: z.string() });
export type PasswordResetLookup = z.infer<typeof passwordResetLookup>;

export const completePasswordResetBody = linkBody.extend({ password: passwordRule });
export type CompletePasswordResetBody = z.infer<typeof completePasswordResetBody>;

/** The browser's forms have a password typed twice, so that a slip of the finger does not lock the account. */
export const samePassword = (f: { password?: string; repeat: string }) => f.password === f.repeat;
export const samePasswordIssue = { path: ['repeat'], message: 'The two passwords differ.' };

export const choosePasswordForm = z.object({ password: passwordRule, repeat: z.string() }).refine(samePassword, samePasswordIssue);
export type ChoosePasswordForm = z.infer<typeof choosePasswordForm>;
