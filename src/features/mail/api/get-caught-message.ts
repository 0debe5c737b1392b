import { useQuery } from '@tanstack/react-query';
import type { CaughtMail } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function getCaughtMessage(id: number, { signal }: { signal?: AbortSignal } = {}): Promise<CaughtMail> {
  return (await api.get<{ message: CaughtMail }>(`/admin/mail/${id}`, { signal })).message;
}

export function useCaughtMessage(id: number | null) {
  return useQuery({ queryKey: mailKeys.caughtMessage(id ?? 0), queryFn: ({ signal }) => getCaughtMessage(id!, { signal }), enabled: id !== null });
}
