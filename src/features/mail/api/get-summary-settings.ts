import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SummarySettings } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function getSummarySettings(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<SummarySettings> {
  return (await api.get<{ settings: SummarySettings }>(`/projects/${projectId}/summary`, { signal })).settings;
}

export const summarySettingsQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: mailKeys.summarySettings(projectId), queryFn: ({ signal }) => getSummarySettings(projectId, { signal }) });

export function useSummarySettings(projectId: number) {
  return useQuery(summarySettingsQueryOptions(projectId));
}
