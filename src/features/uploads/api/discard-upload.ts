import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Upload } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

/** Drops a preview; the file stays in the history, marked discarded, and nothing is imported. */
export async function discardUpload(projectId: number, uploadId: number): Promise<Upload> {
  const body = await api.post<{ upload: Upload }>(`/projects/${projectId}/uploads/${uploadId}/discard`);
  return body.upload;
}

export function useDiscardUpload(projectId: number, uploadId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => discardUpload(projectId, uploadId),
    onSuccess: (upload) => {
      queryClient.setQueryData(uploadKeys.detail(projectId, uploadId), upload);
      return queryClient.invalidateQueries({ queryKey: uploadKeys.list(projectId), exact: true });
    },
  });
}
