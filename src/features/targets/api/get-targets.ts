import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import type { TargetRow } from '@shared/schemas/targets';
import { api } from '@/lib/api-client';
import { targetKeys, type TargetListParams } from './keys';

export function getTargets(projectId: number, params: TargetListParams, { signal }: { signal?: AbortSignal } = {}): Promise<Page<TargetRow>> {
  return api.get<Page<TargetRow>>(`/projects/${projectId}/targets`, { params, signal });
}

export const targetsQueryOptions = (projectId: number, params: TargetListParams) =>
  queryOptions({
    queryKey: targetKeys.list(projectId, params),
    queryFn: ({ signal }) => getTargets(projectId, params, { signal }),
    // Keep the current page on screen while the next page or sort order loads.
    placeholderData: keepPreviousData,
  });

export function useTargets(projectId: number, params: TargetListParams) {
  return useQuery(targetsQueryOptions(projectId, params));
}
