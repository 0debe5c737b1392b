import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SummaryPreview } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function getSummaryPreview(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<SummaryPreview> {
  return (await api.get<{ preview: SummaryPreview }>(`/projects/${projectId}/summary/preview`, { signal })).preview;
}

export const summaryPreviewQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: mailKeys.summaryPreview(projectId), queryFn: ({ signal }) => getSummaryPreview(projectId, { signal }) });

export function useSummaryPreview(projectId: number) {
  return useQuery(summaryPreviewQueryOptions(projectId));
}
