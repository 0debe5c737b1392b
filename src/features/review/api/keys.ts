import type { ReviewQueueQuery } from '@shared/schemas/derived';

/** The queue's filters and page; every one is part of the query key. */
export type ReviewQueueParams = Pick<ReviewQueueQuery, 'page' | 'pageSize' | 'warnings'> & { targetId?: number; quantity?: string };

/** Query keys for the review queue, from general to specific; every key under a project starts with its id. */
export const reviewKeys = {
  all: ['review'] as const,
  project: (projectId: number) => [...reviewKeys.all, projectId] as const,
  queues: (projectId: number) => [...reviewKeys.project(projectId), 'queue'] as const,
  queue: (projectId: number, params: ReviewQueueParams) => [...reviewKeys.queues(projectId), params] as const,
};

/*
 * A decision or a re-run changes what other pages show: target sheets and
 * the project's table (their keys start with ['targets', projectId]), the
 * project and home pages' counts (['projects']), the trail and the home
 * page's recent activity (['trail']). Features do not import each other's
 * key factories, so these prefixes are named here by the shape those
 * factories give them.
 */
export const keysTouchedByReview = (projectId: number) =>
  [reviewKeys.project(projectId), ['targets', projectId], ['projects'], ['trail']] as const;
