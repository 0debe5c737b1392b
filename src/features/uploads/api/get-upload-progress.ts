import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UploadProgress } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

/** Where the commit under way has got to (null before it starts, or when the server knows of none). */
export async function getUploadProgress(projectId: number, uploadId: number, { signal }: { signal?: AbortSignal } = {}): Promise<UploadProgress | null> {
  const body = await api.get<{ progress: UploadProgress | null }>(`/projects/${projectId}/uploads/${uploadId}/progress`, { signal });
  return body.progress;
}

export const uploadProgressQueryOptions = (projectId: number, uploadId: number) =>
  queryOptions({
    queryKey: uploadKeys.progress(projectId, uploadId),
    queryFn: ({ signal }) => getUploadProgress(projectId, uploadId, { signal }),
  });

/** Polled twice a second while `active` (the commit request is in flight); idle otherwise. */
export function useUploadProgress(projectId: number, uploadId: number, active: boolean) {
  return useQuery({ ...uploadProgressQueryOptions(projectId, uploadId), enabled: active, refetchInterval: active ? 500 : false, gcTime: 0 });
}
