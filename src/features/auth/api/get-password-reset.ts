import { useQuery } from '@tanstack/react-query';
import type { PasswordResetLookup } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export async function getPasswordReset(token: string): Promise<PasswordResetLookup> {
  const body = await api.post<{ reset: PasswordResetLookup }>('/auth/password-reset/lookup', { token });
  return body.reset;
}

/** Whose password a reset link sets; a refused link is the page's to explain, not the error page's. */
export function usePasswordReset(token: string) {
  return useQuery({ queryKey: ['password-reset', token], queryFn: () => getPasswordReset(token), enabled: token !== '', throwOnError: false, retry: false, staleTime: Infinity });
}
