import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApiToken } from '@shared/schemas/tokens';
import { api } from '@/lib/api-client';
import { tokenKeys } from './keys';

/** The signed-in person's tokens, newest first, revoked ones included; never the token text itself. */
export async function getTokens({ signal }: { signal?: AbortSignal } = {}): Promise<ApiToken[]> {
  const body = await api.get<{ tokens: ApiToken[] }>('/tokens', { signal });
  return body.tokens;
}

export const tokensQueryOptions = () =>
  queryOptions({
    queryKey: tokenKeys.list(),
    queryFn: ({ signal }) => getTokens({ signal }),
  });

export function useTokens() {
  return useQuery(tokensQueryOptions());
}
