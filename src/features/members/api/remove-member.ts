import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export function removeMember(projectId: number, userId: number): Promise<void> {
  return api.delete(`/projects/${projectId}/members/${userId}`);
}

export function useRemoveMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => removeMember(projectId, userId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) }),
  });
}
