import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationBody, Invitation } from '@shared/schemas/invitations';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export async function createInvitation(projectId: number, body: CreateInvitationBody): Promise<Invitation> {
  const response = await api.post<{ invitation: Invitation }>(`/projects/${projectId}/invitations`, body);
  return response.invitation;
}

export function useCreateInvitation(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateInvitationBody) => createInvitation(projectId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations(projectId) }),
  });
}
