import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddMemberBody, Member } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export async function addMember(projectId: number, body: AddMemberBody): Promise<Member> {
  const response = await api.post<{ member: Member }>(`/projects/${projectId}/members`, body);
  return response.member;
}

export function useAddMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AddMemberBody) => addMember(projectId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) }),
  });
}
