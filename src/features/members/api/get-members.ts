import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Member } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export async function getMembers(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Member[]> {
  const body = await api.get<{ members: Member[] }>(`/projects/${projectId}/members`, { signal });
  return body.members;
}

export const membersQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: memberKeys.list(projectId),
    queryFn: ({ signal }) => getMembers(projectId, { signal }),
  });

export function useMembers(projectId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...membersQueryOptions(projectId), enabled });
}
