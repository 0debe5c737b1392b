import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StoredSpectrum } from '@shared/schemas/uploads';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

/** The spectra committed for a target with their Planck fits, newest first as the server sends them. */
export async function getSpectra(projectId: number, targetId: number, { signal }: { signal?: AbortSignal } = {}): Promise<StoredSpectrum[]> {
  const body = await api.get<{ spectra: StoredSpectrum[] }>(`/projects/${projectId}/targets/${targetId}/spectra`, { signal });
  return body.spectra;
}

export const spectraQueryOptions = (projectId: number, targetId: number) =>
  queryOptions({
    queryKey: targetKeys.spectra(projectId, targetId),
    queryFn: ({ signal }) => getSpectra(projectId, targetId, { signal }),
  });

export function useSpectra(projectId: number, targetId: number) {
  return useQuery(spectraQueryOptions(projectId, targetId));
}
