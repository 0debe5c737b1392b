import { isApiError } from './api-client';

/**
 * A sensitive change's confirmation (server/middleware/confirmation.ts) from
 * the one box the person typed in: with the second factor on, six digits are
 * a code of the authenticator app (no password is that short: 12 at least),
 * anything else the current password.
 */
export function confirmationBody(typed: string | undefined, secondFactorOn: boolean): { currentPassword?: string; code?: string } {
  const value = typed ?? '';
  return secondFactorOn && /^\s*\d{3}\s?\d{3}\s*$/.test(value) ? { code: value.trim() } : { currentPassword: value };
}

/**
 * A refused confirmation outside a form (ConfirmInPlace): the words for the
 * confirmation box when the server named it (currentPassword or code), and
 * the rest (such as too many attempts) for the question's own error line.
 */
export function confirmationRefusal(error: unknown): { field?: string; other: string | null } {
  if (!error) return { other: null };
  const issue = isApiError(error) ? error.fieldIssues.find((i) => i.path === 'currentPassword' || i.path === 'code') : undefined;
  if (issue) return { field: issue.message, other: null };
  return { other: error instanceof Error ? error.message : 'Something went wrong.' };
}
