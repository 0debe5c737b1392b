import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReviewInput, ReviewResult, StaleValueDetail } from '@shared/schemas/derived';
import { api, isApiError } from '@/lib/api-client';
import { keysTouchedByReview } from './keys';

/** Approves or rejects the chosen values, each at the version the lead saw, with one note. */
export function reviewValues(projectId: number, body: ReviewInput): Promise<ReviewResult> {
  return api.post<ReviewResult>(`/projects/${projectId}/review`, body);
}

/** The values that changed since the lead saw them, when the server refused a decision as stale. */
export function staleValues(error: unknown): StaleValueDetail[] {
  if (!isApiError(error) || error.code !== 'stale_value' || !Array.isArray(error.details)) return [];
  return error.details as StaleValueDetail[];
}

/** A value whose upstream cannot be approved, with the server's reason. */
export interface UnapprovableDetail {
  id: number;
  quantity: string;
  message: string;
}

export function unapprovableValues(error: unknown): UnapprovableDetail[] {
  if (!isApiError(error) || error.code !== 'upstream_not_approvable' || !Array.isArray(error.details)) return [];
  return error.details as UnapprovableDetail[];
}

/**
 * A decision changes the queue, the target sheets, the project table and
 * the home page's counts. A refusal for staleness means the queue on screen
 * is out of date, so it is refreshed after a failure too.
 */
export function useReviewValues(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ReviewInput) => reviewValues(projectId, body),
    onSettled: () => Promise.all(keysTouchedByReview(projectId).map((queryKey) => queryClient.invalidateQueries({ queryKey }))),
  });
}
