import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member, UpdateMemberBody } from '@shared/schemas/projects';
import { api } from '@/lib/api-client';
import { memberKeys } from './keys';

export async function updateMember(projectId: number, userId: number, body: UpdateMemberBody): Promise<Member> {
  const response = await api.patch<{ member: Member }>(`/projects/${projectId}/members/${userId}`, body);
  return response.member;
}

export function useUpdateMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, ...body }: UpdateMemberBody & { userId: number }) => updateMember(projectId, userId, body),
    onSuccess: (updated) => {
      queryClient.setQueryData<Member[]>(memberKeys.list(projectId), (members) =>
        members?.map((m) => (m.userId === updated.userId ? updated : m)),
      );
      return queryClient.invalidateQueries({ queryKey: memberKeys.list(projectId) });
    },
  });
}
