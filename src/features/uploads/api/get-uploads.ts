import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Upload } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

/** The project's uploads, newest first (without their previews). */
export async function getUploads(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Upload[]> {
  const body = await api.get<{ uploads: Upload[] }>(`/projects/${projectId}/uploads`, { signal });
  return body.uploads;
}

export const uploadsQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: uploadKeys.list(projectId),
    queryFn: ({ signal }) => getUploads(projectId, { signal }),
  });

export function useUploads(projectId: number) {
  return useQuery(uploadsQueryOptions(projectId));
}
