import { queryOptions, useQuery } from '@tanstack/react-query';
import { getTargets } from './get-targets';
import { targetKeys } from './keys';

export interface TargetChoice {
  id: number;
  designation: string;
}

/** The server's largest page of targets. */
const PAGE_SIZE = 200;

/**
 * Every target of the project by id and designation, for pick-lists and for
 * linking designations to target sheets. Read a page at a time because the
 * list endpoint is paginated.
 */
export async function getTargetChoices(projectId: number, { signal }: { signal?: AbortSignal } = {}): Promise<TargetChoice[]> {
  const out: TargetChoice[] = [];
  for (let page = 1; ; page++) {
    const body = await getTargets(projectId, { page, pageSize: PAGE_SIZE, sort: 'designation', order: 'asc' }, { signal });
    out.push(...body.items.map((t) => ({ id: t.id, designation: t.designation })));
    if (page * PAGE_SIZE >= body.total || body.items.length === 0) return out;
  }
}

export const targetChoicesQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: targetKeys.choices(projectId),
    queryFn: ({ signal }) => getTargetChoices(projectId, { signal }),
  });

export function useTargetChoices(projectId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...targetChoicesQueryOptions(projectId), enabled });
}
