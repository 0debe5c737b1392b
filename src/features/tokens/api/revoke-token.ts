import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { tokenKeys } from './keys';

export function revokeToken(tokenId: number): Promise<void> {
  return api.delete(`/tokens/${tokenId}`);
}

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokenKeys.list() }),
  });
}
