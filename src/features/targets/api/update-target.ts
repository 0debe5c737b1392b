import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Target, UpdateTargetBody } from '@shared/schemas/targets';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

export async function updateTarget(projectId: number, targetId: number, body: UpdateTargetBody): Promise<Target> {
  const response = await api.patch<{ target: Target }>(`/projects/${projectId}/targets/${targetId}`, body);
  return response.target;
}

export function useUpdateTarget(projectId: number, targetId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateTargetBody) => updateTarget(projectId, targetId, body),
    onSuccess: (target) => {
      queryClient.setQueryData(targetKeys.detail(projectId, targetId), target);
      return queryClient.invalidateQueries({ queryKey: targetKeys.lists(projectId) });
    },
  });
}
