import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ActivityEntry } from '@shared/schemas/trail';
import { api } from '@/lib/api-client';
import { trailKeys } from './keys';

/** The newest trail entries of every project whose trail the person's role may read. */
export async function getActivity(limit: number, { signal }: { signal?: AbortSignal } = {}): Promise<ActivityEntry[]> {
  const body = await api.get<{ items: ActivityEntry[] }>('/activity', { params: { limit }, signal });
  return body.items;
}

export const activityQueryOptions = (limit: number) =>
  queryOptions({
    queryKey: trailKeys.activity(limit),
    queryFn: ({ signal }) => getActivity(limit, { signal }),
    staleTime: 0,
  });

export function useActivity(limit = 12) {
  return useQuery(activityQueryOptions(limit));
}
