import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DerivedValue } from '@shared/schemas/derived';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

/** A target's derived values: the current ones (proposed, approved, rejected) or every revision. */
export async function getDerived(
  projectId: number,
  targetId: number,
  include: 'current' | 'all',
  { signal }: { signal?: AbortSignal } = {},
): Promise<DerivedValue[]> {
  const body = await api.get<{ derived: DerivedValue[] }>(`/projects/${projectId}/targets/${targetId}/derived`, { params: { include }, signal });
  return body.derived;
}

export const derivedQueryOptions = (projectId: number, targetId: number, include: 'current' | 'all' = 'current') =>
  queryOptions({
    queryKey: targetKeys.derived(projectId, targetId, include),
    queryFn: ({ signal }) => getDerived(projectId, targetId, include, { signal }),
  });

export function useDerived(projectId: number, targetId: number, include: 'current' | 'all' = 'current') {
  return useQuery(derivedQueryOptions(projectId, targetId, include));
}
