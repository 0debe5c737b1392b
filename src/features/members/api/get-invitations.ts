import { useQuery } from '@tanstack/react-query';
import type { Invitation } from '@shared/schemas/invitations';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export async function getInvitations(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Invitation[]> {
  const body = await api.get<{ invitations: Invitation[] }>(`/projects/${projectId}/invitations`, { signal });
  return body.invitations;
}

/** The project's invitations still waiting for an answer (lead astronomers only). */
export function useInvitations(projectId: number) {
  return useQuery({ queryKey: memberKeys.invitations(projectId), queryFn: ({ signal }) => getInvitations(projectId, { signal }) });
}
