import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailPreference } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';
import { mailKeys } from './keys';

export async function getMailPreferences({ signal }: { signal?: AbortSignal } = {}): Promise<MailPreference[]> {
  return (await api.get<{ preferences: MailPreference[] }>('/mail-preferences', { signal })).preferences;
}

export const mailPreferencesQueryOptions = () => queryOptions({ queryKey: mailKeys.preferences(), queryFn: ({ signal }) => getMailPreferences({ signal }) });

export function useMailPreferences() {
  return useQuery(mailPreferencesQueryOptions());
}
