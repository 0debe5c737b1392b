import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiToken, CreateTokenBody } from '@shared/schemas/tokens';
import { api } from '@/lib/api-client';
import { tokenKeys } from './keys';

/** The new token's text comes back this once; the server keeps only its hash. */
export interface CreatedToken {
  token: string;
  apiToken: ApiToken;
}

export function createToken(body: CreateTokenBody): Promise<CreatedToken> {
  return api.post<CreatedToken>('/tokens', body);
}

export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.list() }),
  });
}
