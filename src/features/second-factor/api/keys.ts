/** Query keys for the signed-in person's second factor. */
export const secondFactorKeys = {
  all: ['second-factor'] as const,
  status: () => [...secondFactorKeys.all, 'status'] as const,
};
