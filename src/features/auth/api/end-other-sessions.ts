import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { sessionKeys } from './get-sessions';

/** Every session of the person but this browser's; answers how many ended. */
export function endOtherSessions(): Promise<{ ended: number }> {
  return api.post<{ ended: number }>('/auth/sessions/end-others');
}

export function useEndOtherSessions() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: endOtherSessions, onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionKeys.list() }) });
}
