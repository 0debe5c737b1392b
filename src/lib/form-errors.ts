import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from './api-client';

/**
 * Puts the server's field problems (error.details) next to the fields they
 * concern. A detail path may be more specific than the form's field (such as
 * `tags.2` for a comma-separated tags box, or `site.name`); it goes to the
 * longest form field that is a prefix of it. Returns the messages that
 * matched no field, for the form-level alert.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): string[] {
  if (!isApiError(error)) return [];
  const unplaced: string[] = [];
  const placed = new Set<string>();
  for (const issue of error.fieldIssues) {
    const field = [...fields]
      .sort((a, b) => b.length - a.length)
      .find((f) => issue.path === f || issue.path.startsWith(`${f}.`));
    if (field && !placed.has(field)) {
      setError(field, { type: 'server', message: issue.message }, { shouldFocus: placed.size === 0 });
      placed.add(field);
    } else if (!field) {
      unplaced.push(issue.path ? `${issue.path}: ${issue.message}` : issue.message);
    }
  }
  return unplaced;
}

/*
 * zod's stock wording for an empty number box ("expected number, received
 * undefined") is for programmers; forms pass this to zodResolver instead.
 * Messages written in the shared schemas still take precedence.
 */
export const formParseOptions = {
  error: (issue: { code?: string; expected?: string; input?: unknown; origin?: string; minimum?: unknown }) => {
    if (issue.code === 'too_small' && issue.origin === 'string' && Number(issue.minimum) === 1) return 'This field is required.';
    if (issue.code !== 'invalid_type') return undefined;
    if (issue.expected === 'number') return issue.input === undefined ? 'Enter a number.' : 'Enter a number (digits, with a point for decimals).';
    if (issue.input === undefined || issue.input === '') return 'This field is required.';
    return undefined;
  },
};

/** For number inputs: an empty box is "no value", not zero. */
export function toOptionalNumber(value: unknown): number | undefined {
  if (value === '' || value === null || value === undefined) return undefined;
  return typeof value === 'number' ? value : Number(value);
}

/** For optional text inputs whose schema treats "absent" differently from "empty". */
export function toOptionalText(value: unknown): string | undefined {
  if (typeof value !== 'string') return undefined;
  return value.trim() === '' ? undefined : value;
}

/**
 * Places a failed submission's field problems at their fields and returns the
 * message for the form as a whole: the server's message when nothing could be
 * placed, or null when every problem is already shown at a field.
 */
export function serverErrorMessage<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fields: readonly Path<T>[],
): string | null {
  const unplaced = applyServerErrors(error, setError, fields);
  if (unplaced.length > 0) return `${isApiError(error) ? error.message : ''} ${unplaced.join(' ')}`.trim();
  if (isApiError(error) && error.fieldIssues.length > 0) return null;
  return error instanceof Error ? error.message : 'Something went wrong.';
}
