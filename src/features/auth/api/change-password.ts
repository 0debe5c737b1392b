import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangePasswordBody, MeResponse } from '@shared/schemas/auth';
import { api, setCsrfToken } from '@/lib/api-client';
import { authKeys } from '@/lib/auth';

export function changePassword(body: ChangePasswordBody): Promise<MeResponse & { message: string }> {
  return api.post<MeResponse & { message: string }>('/auth/password', body);
}

/** Every session of the account ends; this browser carries on in the new one the answer describes (with its own CSRF token). */
export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    onSuccess: ({ message: _message, ...me }) => {
      setCsrfToken(me.csrfToken);
      queryClient.setQueryData(authKeys.me(), me);
    },
  });
}
