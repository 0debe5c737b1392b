import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EndSessionBody } from '@shared/schemas/sessions';
import { api } from '@/lib/api-client';
import { sessionKeys } from './get-sessions';

/** Every session of the person but this browser's, confirmed with the password or a code; answers how many ended. */
export function endOtherSessions(confirmation: EndSessionBody): Promise<{ ended: number }> {
  return api.post<{ ended: number }>('/auth/sessions/end-others', confirmation);
}

export function useEndOtherSessions() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: endOtherSessions, onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionKeys.list() }) });
}
