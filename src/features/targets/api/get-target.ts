import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Target } from '@shared/schemas/targets';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

export async function getTarget(projectId: number, targetId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Target> {
  const body = await api.get<{ target: Target }>(`/projects/${projectId}/targets/${targetId}`, { signal });
  return body.target;
}

export const targetQueryOptions = (projectId: number, targetId: number) =>
  queryOptions({
    queryKey: targetKeys.detail(projectId, targetId),
    queryFn: ({ signal }) => getTarget(projectId, targetId, { signal }),
  });

export function useTarget(projectId: number, targetId: number) {
  return useQuery(targetQueryOptions(projectId, targetId));
}
