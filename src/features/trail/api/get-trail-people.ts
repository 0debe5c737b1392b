import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Member } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { trailKeys } from './keys';

export interface TrailPerson {
  id: number;
  name: string;
}

/** The project's members, offered by the trail's person filter (read from the members endpoint). */
export async function getTrailPeople(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<TrailPerson[]> {
  const body = await api.get<{ members: Member[] }>(`/projects/${projectId}/members`, { signal });
  return body.members.map((m) => ({ id: m.userId, name: m.name })).sort((a, b) => a.name.localeCompare(b.name));
}

export const trailPeopleQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: trailKeys.people(projectId),
    queryFn: ({ signal }) => getTrailPeople(projectId, { signal }),
  });

export function useTrailPeople(projectId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...trailPeopleQueryOptions(projectId), enabled });
}
