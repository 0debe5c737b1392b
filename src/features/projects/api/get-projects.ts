import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Project } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { projectKeys } from './keys';

export async function getProjects({ signal }: { signal?: AbortSignal } = {}): Promise<Project[]> {
  const body = await api.get<{ projects: Project[] }>('/projects', { signal });
  return body.projects;
}

export const projectsQueryOptions = () =>
  queryOptions({
    queryKey: projectKeys.lists(),
    queryFn: ({ signal }) => getProjects({ signal }),
  });

export function useProjects() {
  return useQuery(projectsQueryOptions());
}
