import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeResponse } from '@shared/schemas/auth';
import type { AcceptInvitationBody } from '@shared/schemas/invitations';
import { api } from '@/lib/api-client';
import { adoptSession } from '@/lib/auth';

interface Accepted {
  projectId: number;
  accountCreated: boolean;
  session: MeResponse;
}

export function acceptInvitation(body: AcceptInvitationBody): Promise<Accepted> {
  return api.post<Accepted>('/invitations/accept', body);
}

/** Accepting signs a new account in, and gives an existing one the project: either way the session's roles change. */
export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: acceptInvitation, onSuccess: (accepted) => adoptSession(queryClient, accepted.session) });
}
