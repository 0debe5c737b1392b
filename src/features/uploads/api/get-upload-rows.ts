import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { designationKey } from '@shared/coordinates';
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

const LARGEST_PAGE = 500;
/** A night's file has a few hundred rows; past this the result says "and others" rather than reading a whole survey. */
const MOST_ROWS_READ = 20_000;

/**
 * The distinct designations in the file's target column, in file order, for
 * linking to the targets a commit touched. `truncated` when the file is
 * longer than what is read.
 */
export async function getUploadTargetNames(
  projectId: number,
  uploadId: number,
  column: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<{ names: string[]; truncated: boolean }> {
  const names = new Map<string, string>();
  let page = 1;
  for (;;) {
    const body = await getUploadRows(projectId, uploadId, { page, pageSize: LARGEST_PAGE, onlyErrors: false }, { signal });
    const index = body.headers.indexOf(column);
    if (index < 0) return { names: [], truncated: false };
    for (const row of body.rows) {
      const name = (row.cells[index] ?? '').trim();
      // Designations match case- and space-insensitively, as on the server.
      if (name && !names.has(designationKey(name))) names.set(designationKey(name), name);
    }
    const read = page * LARGEST_PAGE;
    if (read >= body.total) return { names: [...names.values()], truncated: false };
    if (read >= MOST_ROWS_READ) return { names: [...names.values()], truncated: true };
    page += 1;
  }
}

export function useUploadTargetNames(projectId: number, uploadId: number, column: string | null) {
  return useQuery({
    queryKey: uploadKeys.targetNames(projectId, uploadId, column ?? ''),
    queryFn: ({ signal }) => getUploadTargetNames(projectId, uploadId, column ?? '', { signal }),
    enabled: column !== null,
    staleTime: Infinity,
  });
}
