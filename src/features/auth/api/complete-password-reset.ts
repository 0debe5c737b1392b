import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CompletePasswordResetBody } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { authKeys } from '@/lib/auth';

export function completePasswordReset(body: CompletePasswordResetBody): Promise<{ message: string }> {
  return api.post<{ message: string }>('/auth/password-reset/complete', body);
}

/** The account's sessions end, this browser's among them if it was one: the session is asked for again. */
export function useCompletePasswordReset() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: completePasswordReset, onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.me() }) });
}
