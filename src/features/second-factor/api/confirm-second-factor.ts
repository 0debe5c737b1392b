import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ConfirmSecondFactorBody } from '@shared/schemas/second-factor';
import { api } from '@/lib/api-client';
import { refetchSecondFactor } from './get-second-factor';

/** The recovery codes come back this once; the server keeps only their hashes. */
export interface TurnedOn {
  recoveryCodes: string[];
  message: string;
}

export function confirmSecondFactor(body: ConfirmSecondFactorBody): Promise<TurnedOn> {
  return api.post<TurnedOn>('/auth/second-factor/confirm', body);
}

export function useConfirmSecondFactor() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmSecondFactor,
    onSuccess: () => refetchSecondFactor(queryClient),
  });
}
