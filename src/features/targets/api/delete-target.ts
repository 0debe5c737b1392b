import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

export function deleteTarget(projectId: number, targetId: number): Promise<void> {
  return api.delete(`/projects/${projectId}/targets/${targetId}`);
}

export function useDeleteTarget(projectId: number, targetId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteTarget(projectId, targetId),
    // Only the lists: refetching the open target's own page would answer 404 before the page has moved on.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: targetKeys.lists(projectId) }),
  });
}
