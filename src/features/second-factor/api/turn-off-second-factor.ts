import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TurnOffSecondFactorBody } from '@shared/schemas/second-factor';
import { api } from '@/lib/api-client';
import { refetchSecondFactor } from './get-second-factor';

export function turnOffSecondFactor(body: TurnOffSecondFactorBody): Promise<{ message: string }> {
  return api.post<{ message: string }>('/auth/second-factor/off', body);
}

export function useTurnOffSecondFactor() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: turnOffSecondFactor,
    onSuccess: () => refetchSecondFactor(queryClient),
  });
}
