import type { HrQuery } from '@shared/schemas/hr';

/** Query keys for the HR diagram; every key under a project starts with ['hr', projectId]. */
export const hrKeys = {
  all: ['hr'] as const,
  project: (projectId: number) => [...hrKeys.all, projectId] as const,
  diagram: (projectId: number, include: HrQuery['include']) => [...hrKeys.project(projectId), include] as const,
};
