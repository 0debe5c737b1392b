import { useQuery } from '@tanstack/react-query';
import type { InvitationLookup } from '@shared/schemas/invitations';
import { api } from '@/lib/api-client';

export async function getInvitationLink(token: string): Promise<InvitationLookup> {
  const body = await api.post<{ invitation: InvitationLookup }>('/invitations/lookup', { token });
  return body.invitation;
}

/** What an invitation link offers; a refused link (expired, withdrawn, used, unknown) is the page's to explain, not the error page's. */
export function useInvitationLink(token: string) {
  return useQuery({ queryKey: ['invitation-link', token], queryFn: () => getInvitationLink(token), enabled: token !== '', throwOnError: false, retry: false, staleTime: Infinity });
}
