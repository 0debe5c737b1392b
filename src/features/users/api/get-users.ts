import { queryOptions, useQuery } from '@tanstack/react-query';
import type { User } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { userKeys } from './keys';

export async function getUsers({ signal }: { signal?: AbortSignal } = {}): Promise<User[]> {
  const body = await api.get<{ users: User[] }>('/users', { signal });
  return body.users;
}

export const usersQueryOptions = () =>
  queryOptions({
    queryKey: userKeys.lists(),
    queryFn: ({ signal }) => getUsers({ signal }),
  });

export function useUsers() {
  return useQuery(usersQueryOptions());
}
