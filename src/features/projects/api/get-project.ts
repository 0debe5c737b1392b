import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Project } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { projectKeys } from './keys';

export async function getProject(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Project> {
  const body = await api.get<{ project: Project }>(`/projects/${projectId}`, { signal });
  return body.project;
}

export const projectQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: projectKeys.detail(projectId),
    queryFn: ({ signal }) => getProject(projectId, { signal }),
  });

export function useProject(projectId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...projectQueryOptions(projectId), enabled });
}
