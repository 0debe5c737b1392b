/**
 * Error codes are the contract between server and clients (browser and
 * pipelines); messages are for people and may change. The one table of
 * default wording lives here so both sides say the same thing.
 */
export const errorCodes = {
  validation_failed: 'Some fields are not valid.',
  malformed_json: 'The request body is not valid JSON.',
  unauthenticated: 'Sign in first.',
  session_ended: 'Your session has ended. Sign in again.',
  token_expired: 'That API token has expired. Make a new one on your account’s API tokens page.',
  invalid_credentials: 'That e-mail and password do not match an account.',
  forbidden: 'Your role in this project does not allow that.',
  password_change_required: 'Choose a new password before going on.',
  second_factor_required: 'Site admin pages need a second factor: turn it on under Account, or sign in again with your code.',
  not_found: 'Not found.',
  conflict: 'That conflicts with existing data.',
  stale_value: 'A value changed since you saw it. Look at it again before deciding.',
  upstream_not_approvable: 'A value it was computed from cannot be approved.',
  not_proposed: 'Only proposed values can be approved or rejected.',
  csrf_invalid: 'The form was stale or came from another site. Reload the page and try again.',
  rate_limited: 'Too many attempts. Wait a few minutes and try again.',
  link_unknown: 'This link is not known.',
  link_expired: 'This link has expired.',
  link_used: 'This link has already been used.',
  link_revoked: 'This invitation was withdrawn.',
  payload_too_large: 'The request is too large.',
  upload_quota_exceeded: 'Your uploads have used the space each person may keep. Ask the site admin to raise the quota.',
  unsupported_media_type: 'The request’s body is not of the type this address reads.',
  database_busy: 'The database is busy (a backup or another writer holds it). Nothing was changed; try again in a few seconds.',
  storage_full: 'The server’s storage is full, so nothing was saved. Ask the site admin to free disk space, then try again.',
  second_factor_key_mismatch:
    'One-time codes cannot be checked: this server’s SECOND_FACTOR_KEY is not the key your second factor was sealed with. Nothing was changed; ask the site’s operator to restore the key kept with the backups (README, Configuration).',
  internal: 'Something went wrong on the server. The error was logged.',
} as const;

export type ErrorCode = keyof typeof errorCodes;

/** A problem with one field: `path` is the field name (dotted for nested fields). */
export interface FieldIssue {
  path: string;
  message: string;
}

export interface ApiErrorBody {
  error: {
    code: ErrorCode | (string & {});
    message: string;
    details?: unknown;
  };
}

export function messageFor(code: string): string {
  return (errorCodes as Record<string, string>)[code] ?? errorCodes.internal;
}
