/** The rows-page filters of one upload's preview; every one is part of the query key. */
export interface UploadRowsParams {
  page: number;
  pageSize: number;
  onlyErrors: boolean;
}

/** Query keys for uploads, from general to specific; every key under a project starts with its id. */
export const uploadKeys = {
  all: ['uploads'] as const,
  project: (projectId: number) => [...uploadKeys.all, projectId] as const,
  list: (projectId: number) => [...uploadKeys.project(projectId), 'list'] as const,
  details: (projectId: number) => [...uploadKeys.project(projectId), 'detail'] as const,
  detail: (projectId: number, uploadId: number) => [...uploadKeys.details(projectId), uploadId] as const,
  rows: (projectId: number, uploadId: number, params: UploadRowsParams) => [...uploadKeys.detail(projectId, uploadId), 'rows', params] as const,
  progress: (projectId: number, uploadId: number) => [...uploadKeys.detail(projectId, uploadId), 'progress'] as const,
};

/*
 * Downloads are plain links to the API (the browser saves what the server
 * sends as an attachment), so they are addresses rather than fetchers.
 */
export const uploadDownloads = {
  template: (projectId: number, layout: 'long' | 'wide') => `/api/projects/${projectId}/uploads/templates/${layout}.csv`,
  file: (projectId: number, uploadId: number) => `/api/projects/${projectId}/uploads/${uploadId}/file`,
};
