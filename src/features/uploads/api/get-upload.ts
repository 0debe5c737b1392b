import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Upload } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

export async function getUpload(projectId: number, uploadId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Upload> {
  const body = await api.get<{ upload: Upload }>(`/projects/${projectId}/uploads/${uploadId}`, { signal });
  return body.upload;
}

export const uploadQueryOptions = (projectId: number, uploadId: number) =>
  queryOptions({
    queryKey: uploadKeys.detail(projectId, uploadId),
    queryFn: ({ signal }) => getUpload(projectId, uploadId, { signal }),
  });

export function useUpload(projectId: number, uploadId: number) {
  return useQuery(uploadQueryOptions(projectId, uploadId));
}
