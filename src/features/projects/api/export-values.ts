import type { ExportValuesQuery } from '@shared/schemas/derived';

/*
 * The values export is a plain link to the API (the browser saves the
 * attachment the server streams), so this is an address, not a fetcher.
 */
export function valuesExportHref(projectId: number, format: ExportValuesQuery['format'], include: ExportValuesQuery['include']): string {
  return `/api/projects/${projectId}/values/export?${new URLSearchParams({ format, include }).toString()}`;
}
