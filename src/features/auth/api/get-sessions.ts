import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AccountSessionsResponse } from '@shared/schemas/sessions';
import { api } from '@/lib/api-client';

/** Query keys for the signed-in person's own sessions. */
export const sessionKeys = {
  all: ['account-sessions'] as const,
  list: () => [...sessionKeys.all, 'list'] as const,
};

/** Where and since when the person is signed in: this browser first, then by last use. */
export function getSessions({ signal }: { signal?: AbortSignal } = {}): Promise<AccountSessionsResponse> {
  return api.get<AccountSessionsResponse>('/auth/sessions', { signal });
}

export const sessionsQueryOptions = () => queryOptions({ queryKey: sessionKeys.list(), queryFn: ({ signal }) => getSessions({ signal }) });

export function useSessions() {
  return useQuery(sessionsQueryOptions());
}
