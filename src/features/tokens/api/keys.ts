/** Query keys for the signed-in person's API tokens. */
export const tokenKeys = {
  all: ['tokens'] as const,
  list: () => [...tokenKeys.all, 'list'] as const,
};
