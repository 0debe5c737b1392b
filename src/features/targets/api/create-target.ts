import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateTargetBody, Target } from '@shared/schemas/targets';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

export async function createTarget(projectId: number, body: CreateTargetBody): Promise<Target> {
  const response = await api.post<{ target: Target }>(`/projects/${projectId}/targets`, body);
  return response.target;
}

export function useCreateTarget(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateTargetBody) => createTarget(projectId, body),
    onSuccess: (target) => {
      queryClient.setQueryData(targetKeys.detail(projectId, target.id), target);
      return queryClient.invalidateQueries({ queryKey: targetKeys.lists(projectId) });
    },
  });
}
