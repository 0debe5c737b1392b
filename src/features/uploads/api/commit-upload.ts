import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CommitResult } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { uploadKeys } from './keys';

/** Imports the file whole; the answer counts what it added and names every target it touched. */
export function commitUpload(projectId: number, uploadId: number, confirmDuplicate: boolean): Promise<CommitResult> {
  return api.post<CommitResult>(`/projects/${projectId}/uploads/${uploadId}/commit`, { confirmDuplicate });
}

/**
 * After a commit the project's targets, measurements and derived values have
 * changed too; `onCommitted` lets the page refresh what it shows of them
 * (features do not reach into each other's caches).
 */
export function useCommitUpload(projectId: number, uploadId: number, onCommitted?: () => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ confirmDuplicate }: { confirmDuplicate: boolean }) => commitUpload(projectId, uploadId, confirmDuplicate),
    onSuccess: (result) => {
      queryClient.setQueryData(uploadKeys.detail(projectId, uploadId), result.upload);
      onCommitted?.();
      return queryClient.invalidateQueries({ queryKey: uploadKeys.list(projectId), exact: true });
    },
  });
}
