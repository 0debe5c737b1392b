import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TrailPage } from '@shared/schemas/trail';
import { api } from '@/lib/api-client';
import { trailKeys, type TrailListParams } from './keys';

/** One page of the project's trail, newest first, filtered on the server. */
export function getTrail(projectId: number, params: TrailListParams, { signal }: { signal?: AbortSignal } = {}): Promise<TrailPage> {
  return api.get<TrailPage>(`/projects/${projectId}/trail`, { params: { ...params }, signal });
}

export const trailQueryOptions = (projectId: number, params: TrailListParams) =>
  queryOptions({
    queryKey: trailKeys.list(projectId, params),
    queryFn: ({ signal }) => getTrail(projectId, params, { signal }),
    // A record of what happened is read fresh each time it is opened.
    staleTime: 0,
  });

export function useTrail(projectId: number, params: TrailListParams, { enabled = true }: { enabled?: boolean } = {}) {
  // The previous page stays on screen, dimmed, while the next one loads.
  return useQuery({ ...trailQueryOptions(projectId, params), enabled, placeholderData: keepPreviousData });
}
