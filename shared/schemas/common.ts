import { z } from 'zod';

export const idParam = z.coerce.number().int().positive();

export const paginationQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}
