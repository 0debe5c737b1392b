import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { UploadRowsPage } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys, type UploadRowsParams } from './keys';

/** One page of the file as it was sent, each row with its errors. */
export function getUploadRows(
  projectId: number,
  uploadId: number,
  params: UploadRowsParams,
  { signal }: { signal?: AbortSignal } = {},
): Promise<UploadRowsPage> {
  return api.get<UploadRowsPage>(`/projects/${projectId}/uploads/${uploadId}/rows`, {
    params: { page: params.page, pageSize: params.pageSize, onlyErrors: params.onlyErrors },
    signal,
  });
}

export const uploadRowsQueryOptions = (projectId: number, uploadId: number, params: UploadRowsParams) =>
  queryOptions({
    queryKey: uploadKeys.rows(projectId, uploadId, params),
    queryFn: ({ signal }) => getUploadRows(projectId, uploadId, params, { signal }),
    // The current page stays on screen while the next page or the error filter loads.
    placeholderData: keepPreviousData,
  });

export function useUploadRows(projectId: number, uploadId: number, params: UploadRowsParams) {
  return useQuery(uploadRowsQueryOptions(projectId, uploadId, params));
}
