import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RederiveResult } from '@shared/schemas/derived';
import { api } from '@/lib/api-client';
import { keysTouchedByReview } from './keys';

/** Re-runs the derivations of one target, or of the whole project without a target; only changed values become new proposals. */
export function rederive(projectId: number, targetId?: number): Promise<RederiveResult> {
  return api.post<RederiveResult>(`/projects/${projectId}/rederive`, targetId === undefined ? {} : { targetId });
}

export function useRederive(projectId: number, targetId?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => rederive(projectId, targetId),
    onSuccess: () => Promise.all(keysTouchedByReview(projectId).map((queryKey) => queryClient.invalidateQueries({ queryKey }))),
  });
}
