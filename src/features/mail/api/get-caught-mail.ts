import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaughtMailSummary } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function getCaughtMail({ signal }: { signal?: AbortSignal } = {}): Promise<CaughtMailSummary[]> {
  return (await api.get<{ messages: CaughtMailSummary[] }>('/admin/mail', { signal })).messages;
}

export const caughtMailQueryOptions = () => queryOptions({ queryKey: mailKeys.caught(), queryFn: ({ signal }) => getCaughtMail({ signal }) });

export function useCaughtMail() {
  // The fake keeps receiving while the page is open (the outbox worker sends every few seconds).
  return useQuery({ ...caughtMailQueryOptions(), refetchInterval: 5000 });
}
