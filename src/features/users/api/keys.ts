/** Query keys for user accounts (site administration), from general to specific. */
export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
};
