import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Measurement } from '@shared/schemas/derived';
import { api } from '@/lib/api-client';
import { targetKeys } from './keys';

/** Every measurement of a target, newest observation first. */
export async function getMeasurements(projectId: number, targetId: number, { signal }: { signal?: AbortSignal } = {}): Promise<Measurement[]> {
  const body = await api.get<{ measurements: Measurement[] }>(`/projects/${projectId}/targets/${targetId}/measurements`, { signal });
  return body.measurements;
}

export const measurementsQueryOptions = (projectId: number, targetId: number) =>
  queryOptions({
    queryKey: targetKeys.measurements(projectId, targetId),
    queryFn: ({ signal }) => getMeasurements(projectId, targetId, { signal }),
  });

export function useMeasurements(projectId: number, targetId: number) {
  return useQuery(measurementsQueryOptions(projectId, targetId));
}
