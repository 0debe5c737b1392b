import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SendSummaryResult } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function sendSummary(projectId: number): Promise<SendSummaryResult> {
  return (await api.post<{ result: SendSummaryResult }>(`/projects/${projectId}/summary/send`)).result;
}

export function useSendSummary(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => sendSummary(projectId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: mailKeys.summarySettings(projectId) }),
  });
}
