import { z } from 'zod';

/** Recovery codes made when the second factor is turned on, each good for one sign-in instead of a code. */
export const RECOVERY_CODE_COUNT = 10;

/** Six digits from the authenticator app; spaces are let through, as apps show "123 456". */
export const oneTimeCode = z.string().trim().regex(/^\d{3}\s?\d{3}$/, 'Type the six digits your authenticator app shows now.');

/** A secret to enrol: its QR code (an SVG data URL), the same secret as text for typing in, and the otpauth:// address both carry. */
export const secondFactorEnrolment = z.object({ secret: z.string(), uri: z.string(), qrCode: z.string() });
export type SecondFactorEnrolment = z.infer<typeof secondFactorEnrolment>;


/** The code step of sign-in: six digits, or one of the recovery codes. */
export const signInCodeBody = z.object({
  code: z.string().trim().min(1, 'Type the six digits your authenticator app shows, or one of your recovery codes.').max(40, 'A code is at most 40 characters.'),
});
export type SignInCodeBody = z.infer<typeof signInCodeBody>;

/** The sign-in's first answer when the account has a second factor: no session yet, a code is asked for. */
export const secondFactorAsked = z.object({ secondFactorRequired: z.literal(true), message: z.string() });
export type SecondFactorAsked = z.infer<typeof secondFactorAsked>;

export const secondFactorStatus = z.object({ on: z.boolean(), recoveryCodesLeft: z.number() });
export type SecondFactorStatus = z.infer<typeof secondFactorStatus>;

/**
 * The re-authentication a sensitive change carries in its own body (ASVS
 * 3.7.1, 4.3.3): the current password, or — for an account with the second
 * factor on — a current code; turning the factor off wants both
 * (server/middleware/confirmation.ts checks them).
 */
export const confirmationFields = {
  currentPassword: z.string().max(1000).optional(),
  code: z.string().trim().max(40).optional(),
};

export const turnOffSecondFactorBody = z.object({ ...confirmationFields });

/**
 * The first code of the secret being enrolled, with the current password
 * (checked by the route's confirmation), so that a borrowed session cannot
 * put its own device on the account and lock its owner out.
 */
export const confirmSecondFactorBody = z.object({ currentPassword: confirmationFields.currentPassword, code: oneTimeCode });
export type ConfirmSecondFactorBody = z.infer<typeof confirmSecondFactorBody>;
export type TurnOffSecondFactorBody = z.infer<typeof turnOffSecondFactorBody>;
