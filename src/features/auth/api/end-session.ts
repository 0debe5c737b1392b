import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { sessionKeys } from './get-sessions';

export function endSession(sessionId: string): Promise<void> {
  return api.delete(`/auth/sessions/${encodeURIComponent(sessionId)}`);
}

export function useEndSession() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: endSession, onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionKeys.list() }) });
}
