import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateProjectBody, Project } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { projectKeys } from './keys';

export async function createProject(body: CreateProjectBody): Promise<Project> {
  const response = await api.post<{ project: Project }>('/projects', body);
  return response.project;
}

export function useCreateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProject,
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists() });
    },
  });
}
