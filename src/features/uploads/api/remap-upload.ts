import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ColumnMapping } from '@shared/file-reading/measurement-file';
import type { Upload } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

/** Reads the kept file again under another column mapping. */
export async function remapUpload(projectId: number, uploadId: number, mapping: ColumnMapping): Promise<Upload> {
  const body = await api.post<{ upload: Upload }>(`/projects/${projectId}/uploads/${uploadId}/mapping`, { mapping });
  return body.upload;
}

export function useRemapUpload(projectId: number, uploadId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapping: ColumnMapping) => remapUpload(projectId, uploadId, mapping),
    onSuccess: (upload) => {
      queryClient.setQueryData(uploadKeys.detail(projectId, uploadId), upload);
      // The rows' errors change with the mapping; the upload itself was just set.
      void queryClient.invalidateQueries({
        queryKey: uploadKeys.detail(projectId, uploadId),
        predicate: (query) => query.queryKey.length > uploadKeys.detail(projectId, uploadId).length,
      });
      return queryClient.invalidateQueries({ queryKey: uploadKeys.list(projectId), exact: true });
    },
  });
}
