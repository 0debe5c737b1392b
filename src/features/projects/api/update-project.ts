import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Project, UpdateProjectBody } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { projectKeys } from './keys';

export async function updateProject(projectId: number, body: UpdateProjectBody): Promise<Project> {
  const response = await api.patch<{ project: Project }>(`/projects/${projectId}`, body);
  return response.project;
}

export function useUpdateProject(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateProjectBody) => updateProject(projectId, body),
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(projectId), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}
