import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewQueue } from '@shared/schemas/derived';
import { api } from '@/lib/api-client';
import { reviewKeys, type ReviewQueueParams } from './keys';

/** One page of proposed values awaiting the lead's decision, each beside the approved value it would replace. */
export function getReviewQueue(projectId: number, params: ReviewQueueParams, { signal }: { signal?: AbortSignal } = {}): Promise<ReviewQueue> {
  return api.get<ReviewQueue>(`/projects/${projectId}/review-queue`, { params, signal });
}

export const reviewQueueQueryOptions = (projectId: number, params: ReviewQueueParams) =>
  queryOptions({
    queryKey: reviewKeys.queue(projectId, params),
    queryFn: ({ signal }) => getReviewQueue(projectId, params, { signal }),
    // Keep the current page on screen while another page or filter loads.
    placeholderData: keepPreviousData,
  });

export function useReviewQueue(projectId: number, params: ReviewQueueParams, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...reviewQueueQueryOptions(projectId, params), enabled });
}
