import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@shared/schemas/common';
import type { Target } from '@shared/schemas/targets';
import { api } from '@/lib/api-client';
import { trailKeys } from './keys';

export interface TrailTarget {
  id: number;
  designation: string;
}

/** The server's largest page of targets. */
const PAGE_SIZE = 200;

/**
 * Every target of the project by id and designation, for the trail's target
 * filter and for linking entries to target sheets (a target missing here was
 * deleted). Read a page at a time because the list endpoint is paginated.
 */
export async function getTrailTargets(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<TrailTarget[]> {
  const out: TrailTarget[] = [];
  for (let page = 1; ; page++) {
    const body = await api.get<Page<Target>>(`/projects/${projectId}/targets`, {
      params: { page, pageSize: PAGE_SIZE, sort: 'designation', order: 'asc' },
      signal,
    });
    out.push(...body.items.map((t) => ({ id: t.id, designation: t.designation })));
    if (page * PAGE_SIZE >= body.total || body.items.length === 0) return out;
  }
}

export const trailTargetsQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: trailKeys.targets(projectId),
    queryFn: ({ signal }) => getTrailTargets(projectId, { signal }),
  });

export function useTrailTargets(projectId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...trailTargetsQueryOptions(projectId), enabled });
}
