import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { EndSessionBody } from '@shared/schemas/sessions';
import { api } from '@/lib/api-client';
import { sessionKeys } from './get-sessions';

/** Confirmed with the password or a code, as ending a session is asked to be (ASVS 3.3.4). */
export function endSession({ sessionId, ...confirmation }: { sessionId: string } & EndSessionBody): Promise<void> {
  return api.delete(`/auth/sessions/${encodeURIComponent(sessionId)}`, confirmation);
}

export function useEndSession() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: endSession, onSuccess: () => queryClient.invalidateQueries({ queryKey: sessionKeys.list() }) });
}
