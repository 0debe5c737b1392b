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
      // A changed assumed luminosity class re-derives the target, so its values (under the detail key) and the table change too.
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: targetKeys.detail(projectId, targetId), predicate: (q) => q.queryKey.length > 4 }),
        queryClient.invalidateQueries({ queryKey: targetKeys.lists(projectId) }),
      ]);
    },
  });
}
