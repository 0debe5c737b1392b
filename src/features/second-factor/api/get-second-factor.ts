import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { SecondFactorStatus } from '@shared/schemas/second-factor';
import { api } from '@/lib/api-client';
import { authKeys } from '@/lib/auth';
import { secondFactorKeys } from './keys';

/** Whether the second factor is on, and how many recovery codes are left. */
export function getSecondFactor({ signal }: { signal?: AbortSignal } = {}): Promise<SecondFactorStatus> {
  return api.get<SecondFactorStatus>('/auth/second-factor', { signal });
}

export const secondFactorQueryOptions = () =>
  queryOptions({
    queryKey: secondFactorKeys.status(),
    queryFn: ({ signal }) => getSecondFactor({ signal }),
  });

export function useSecondFactor() {
  return useQuery(secondFactorQueryOptions());
}

/** After turning it on or off: the status, and the session's record of the account (forms ask for a code when it is on). */
export function refetchSecondFactor(queryClient: QueryClient) {
  return Promise.all([queryClient.invalidateQueries({ queryKey: secondFactorKeys.all }), queryClient.invalidateQueries({ queryKey: authKeys.me() })]);
}
