import { useMutation } from '@tanstack/react-query';
import type { PasswordResetRequestBody } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export function requestPasswordReset(body: PasswordResetRequestBody): Promise<{ message: string }> {
  return api.post<{ message: string }>('/auth/password-reset', body);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
