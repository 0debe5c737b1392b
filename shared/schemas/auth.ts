import { z } from 'zod';
import { projectRole } from './roles';

export const loginBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  password: z.string().min(1, 'Enter your password.'),
});
export type LoginBody = z.infer<typeof loginBody>;

export const userSchema = z.object({
  id: z.number(),
  email: z.string(),
  name: z.string(),
  isSiteAdmin: z.boolean(),
});
export type User = z.infer<typeof userSchema>;

export const membershipSchema = z.object({
  projectId: z.number(),
  role: projectRole,
});

export const meResponse = z.object({
  user: userSchema,
  memberships: z.array(membershipSchema),
  csrfToken: z.string(),
});
export type MeResponse = z.infer<typeof meResponse>;

export const passwordRule = z.string().min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.');

export const createUserBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  password: passwordRule,
  isSiteAdmin: z.boolean().default(false),
});
export type CreateUserBody = z.infer<typeof createUserBody>;
