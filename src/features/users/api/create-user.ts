import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateUserBody, User } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { userKeys } from './keys';

export async function createUser(body: CreateUserBody): Promise<User> {
  const response = await api.post<{ user: User }>('/users', body);
  return response.user;
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
