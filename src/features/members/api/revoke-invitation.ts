import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export function revokeInvitation(projectId: number, invitationId: number): Promise<void> {
  return api.delete(`/projects/${projectId}/invitations/${invitationId}`);
}

export function useRevokeInvitation(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: number) => revokeInvitation(projectId, invitationId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: memberKeys.invitations(projectId) }),
  });
}
