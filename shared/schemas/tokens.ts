import { z } from 'zod';

export const createTokenBody = z.object({
  name: z.string().trim().min(1, 'Name the token after what will use it.').max(80, 'Use at most 80 characters.'),
});
export type CreateTokenBody = z.infer<typeof createTokenBody>;

export const apiTokenSchema = z.object({
  id: z.number(),
  name: z.string(),
  prefix: z.string(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiToken = z.infer<typeof apiTokenSchema>;
