import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MailPreference, UpdateMailPreferenceBody } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function updateMailPreference(projectId: number, body: UpdateMailPreferenceBody): Promise<MailPreference> {
  return (await api.patch<{ preference: MailPreference }>(`/projects/${projectId}/mail-preferences`, body)).preference;
}

/** Saves one choice; the box shows it at once and goes back if the server refuses. */
export function useUpdateMailPreference() {
  const queryClient = useQueryClient();
  const key = mailKeys.preferences();
  const replace = (saved: MailPreference) => queryClient.setQueryData<MailPreference[]>(key, (old) => old?.map((p) => (p.projectId === saved.projectId ? saved : p)));
  return useMutation({
    mutationFn: ({ projectId, body }: { projectId: number; body: UpdateMailPreferenceBody }) => updateMailPreference(projectId, body),
    onMutate: async ({ projectId, body }) => {
      await queryClient.cancelQueries({ queryKey: key });
      const before = queryClient.getQueryData<MailPreference[]>(key);
      const current = before?.find((p) => p.projectId === projectId);
      if (current) replace({ ...current, ...body });
      return { before };
    },
    onError: (_error, _vars, context) => queryClient.setQueryData(key, context?.before),
    onSuccess: replace,
  });
}
