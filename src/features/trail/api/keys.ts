import type { TrailFilters } from '@shared/schemas/trail';

/** One page of a project's trail: the filters and the page, every one part of the query key. */
export interface TrailListParams extends TrailFilters {
  page: number;
  pageSize: number;
}

/** Query keys for the review trail, from general to specific; every key under a project starts with its id. */
export const trailKeys = {
  all: ['trail'] as const,
  project: (projectId: number) => [...trailKeys.all, projectId] as const,
  lists: (projectId: number) => [...trailKeys.project(projectId), 'list'] as const,
  list: (projectId: number, params: TrailListParams) => [...trailKeys.lists(projectId), params] as const,
  activity: (limit: number) => [...trailKeys.all, 'activity', limit] as const,
};

/*
 * The export is a plain link to the API (the browser saves the attachment
 * the server streams), so it is an address built from the same filters the
 * page shows, not a fetcher.
 */
export function trailExportHref(projectId: number, filters: TrailFilters, format: 'csv' | 'json'): string {
  const search = new URLSearchParams({ format });
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return `/api/projects/${projectId}/trail/export?${search.toString()}`;
}
