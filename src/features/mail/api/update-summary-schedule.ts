import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SummarySchedule, SummarySettings } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function updateSummarySchedule(projectId: number, schedule: SummarySchedule): Promise<SummarySettings> {
  return (await api.patch<{ settings: SummarySettings }>(`/projects/${projectId}/summary`, schedule)).settings;
}

export function useUpdateSummarySchedule(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (schedule: SummarySchedule) => updateSummarySchedule(projectId, schedule),
    onSuccess: (settings) => queryClient.setQueryData(mailKeys.summarySettings(projectId), settings),
  });
}
