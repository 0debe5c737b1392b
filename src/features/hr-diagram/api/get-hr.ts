import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { HrDiagram, HrQuery } from '@shared/schemas/hr';
import { api } from '@/lib/api-client';
import { hrKeys } from './keys';

/** Every target with a temperature and a luminosity; readers are served approved values whatever they ask. */
export function getHr(projectId: number, include: HrQuery['include'], { signal }: { signal?: AbortSignal } = {}): Promise<HrDiagram> {
  return api.get<HrDiagram>(`/projects/${projectId}/hr`, { params: { include }, signal });
}

export const hrQueryOptions = (projectId: number, include: HrQuery['include']) =>
  queryOptions({
    queryKey: hrKeys.diagram(projectId, include),
    queryFn: ({ signal }) => getHr(projectId, include, { signal }),
    // Switching between approved and proposed keeps the diagram on screen until the other set arrives.
    placeholderData: keepPreviousData,
  });

export function useHr(projectId: number, include: HrQuery['include']) {
  return useQuery(hrQueryOptions(projectId, include));
}
