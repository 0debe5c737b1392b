import type { ListTargetsQuery } from '@shared/schemas/targets';

/** The list filters a target table sends; every one is part of the query key. */
export type TargetListParams = Pick<ListTargetsQuery, 'page' | 'pageSize' | 'sort' | 'order'> & { q?: string; tag?: string; awaiting?: true };

/** Query keys for targets, from general to specific; every key under a project starts with its id. */
export const targetKeys = {
  all: ['targets'] as const,
  project: (projectId: number) => [...targetKeys.all, projectId] as const,
  lists: (projectId: number) => [...targetKeys.project(projectId), 'list'] as const,
  list: (projectId: number, params: TargetListParams) => [...targetKeys.lists(projectId), params] as const,
  details: (projectId: number) => [...targetKeys.project(projectId), 'detail'] as const,
  detail: (projectId: number, targetId: number) => [...targetKeys.details(projectId), targetId] as const,
  derived: (projectId: number, targetId: number, include: 'current' | 'all') => [...targetKeys.detail(projectId, targetId), 'derived', include] as const,
  measurements: (projectId: number, targetId: number) => [...targetKeys.detail(projectId, targetId), 'measurements'] as const,
  spectra: (projectId: number, targetId: number) => [...targetKeys.detail(projectId, targetId), 'spectra'] as const,
  choices: (projectId: number) => [...targetKeys.project(projectId), 'choices'] as const,
};
