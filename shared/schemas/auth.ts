import { z } from 'zod';
import { projectRole } from './roles';
import { confirmationFields } from './second-factor';

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
  /** Null, or why the account must choose a new password before anything else (passwordChangeReasons). */
  mustChangePassword: z.enum(['weak', 'initial']).nullable(),
  /** Whether sign-in asks for a one-time code after the password (server/modules/second-factor). */
  secondFactor: z.boolean(),
});
export type User = z.infer<typeof userSchema>;
export type PasswordChangeReason = NonNullable<User['mustChangePassword']>;

/**
 * Why a new password is asked for, said by the server's refusal of every
 * other route (403 password_change_required) and by the form that asks:
 * the password signed in with is now refused for new ones (ASVS 2.1.7), or
 * a site admin typed it when making the account (2.3.1).
 */
export const passwordChangeReasons: Record<PasswordChangeReason, string> = {
  weak: 'The password you signed in with is now refused for new passwords (it is too short, one of the most common, or made of your own name or e-mail). Choose a new one before going on.',
  initial: 'A site admin chose the password you signed in with. Choose one of your own before going on.',
};

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

/**
 * The length of a new password (ASVS 4.0 2.1.1 and 2.1.2: at least 12,
 * at least 64 allowed, none over 128). Any characters, spaces included, and no rules
 * about kinds of character (2.1.9); a few words together make a good one.
 * The server also refuses common passwords and ones made of the account's
 * own words (server/lib/passwords.ts, acceptablePassword).
 */
export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 128;
export const passwordRule = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters; a few words together make a good password.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`);

/** The hint beside every field where a new password is chosen. */
export const PASSWORD_HINT = `${PASSWORD_MIN_LENGTH} to ${PASSWORD_MAX_LENGTH} characters, any kind; a few words together make a good password. Not a common one, not your e-mail or name.`;

/** What a password must not be made of: the account's e-mail, its parts, the person's name, the product's name. */
export interface PasswordContext {
  email: string;
  name?: string | null;
}

const lettersOf = (s: string) => s.toLowerCase().replace(/[^\p{L}]+/gu, '');

/**
 * A password made only of the account's own words (its e-mail or the part
 * before the @, the name or a part of it, "Starledger"), with or without
 * digits and symbols, is refused (ASVS 4.0 2.1.7, context-specific words):
 * "starledger2026", "Tobiah.Ferrand!1" and "lead@demo.invalid" are; a
 * phrase with other words in it, like "lead-demo-2026" for lead@…, is not.
 */
export function contextualPasswordProblem(password: string, context: PasswordContext): string | undefined {
  const local = context.email.split('@')[0] ?? '';
  const words = [context.email, local, ...local.split(/[^\p{L}]+/u), context.name ?? '', ...(context.name ?? '').split(/\s+/), 'starledger']
    .map(lettersOf)
    .filter((w) => w.length >= 2)
    .sort((a, b) => b.length - a.length);
  const letters = lettersOf(password);
  if (letters === '') return undefined;
  let rest = letters;
  for (const word of words) rest = rest.split(word).join('');
  return rest === '' ? 'This password is made of your e-mail, your name or "Starledger", which are guessed first. Add words of your own.' : undefined;
}

export const createUserBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  password: passwordRule,
  isSiteAdmin: z.boolean().default(false),
  // The site admin confirms a new account with their own password or a code (ASVS 4.3.3).
  ...confirmationFields,
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

/** A signed-in person's new password; the current one proves it is them at the keyboard. */
export const changePasswordBody = z.object({
  currentPassword: z.string().min(1, 'Enter your current password.'),
  password: passwordRule,
});
export type ChangePasswordBody = z.infer<typeof changePasswordBody>;

export const changePasswordForm = changePasswordBody.extend({ repeat: z.string() }).refine(samePassword, samePasswordIssue);
export type ChangePasswordForm = z.infer<typeof changePasswordForm>;

export const choosePasswordForm = z.object({ password: passwordRule, repeat: z.string() }).refine(samePassword, samePasswordIssue);
export type ChoosePasswordForm = z.infer<typeof choosePasswordForm>;
