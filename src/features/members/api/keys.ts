/** Query keys for project members, from general to specific. */
export const memberKeys = {
  all: ['members'] as const,
  lists: () => [...memberKeys.all, 'list'] as const,
  list: (projectId: number) => [...memberKeys.lists(), projectId] as const,
  /** Invitations still waiting for an answer. */
  invitations: (projectId: number) => [...memberKeys.all, 'invitations', projectId] as const,
};
