import { z } from 'zod';
import { parseDeclination, parseRightAscension } from '../coordinates';
import { paginationQuery } from './common';

const raInput = z.union([z.string(), z.number()]).transform((value, ctx) => {
  const r = parseRightAscension(value);
  if (!r.ok) {
    ctx.addIssue({ code: 'custom', message: r.message });
    return z.NEVER;
  }
  return r.degrees;
});

const decInput = z.union([z.string(), z.number()]).transform((value, ctx) => {
  const r = parseDeclination(value);
  if (!r.ok) {
    ctx.addIssue({ code: 'custom', message: r.message });
    return z.NEVER;
  }
  return r.degrees;
});

export const designation = z
  .string()
  .trim()
  .min(1, 'Enter a designation.')
  .max(64, 'Use at most 64 characters.')
  .regex(/^[\p{L}\p{N}][\p{L}\p{N} .+\-_*'/]*$/u, 'Start with a letter or digit; use letters, digits, spaces and . + - _ * \' / only.');

const tags = z
  .array(z.string().trim().min(1).max(32).regex(/^[\p{L}\p{N}_-]+$/u, 'Tags are single words (letters, digits, - or _).'))
  .max(20)
  .default([]);

/** Coordinates come as strings or numbers; the parsed value is in degrees. */
export const createTargetBody = z.object({
  designation,
  ra: raInput,
  dec: decInput,
  notes: z.string().max(4000).default(''),
  tags,
});
export type CreateTargetInput = z.input<typeof createTargetBody>;
export type CreateTargetBody = z.output<typeof createTargetBody>;

export const updateTargetBody = z.object({
  designation: designation.optional(),
  ra: raInput.optional(),
  dec: decInput.optional(),
  notes: z.string().max(4000).optional(),
  tags: tags.optional(),
});
export type UpdateTargetBody = z.output<typeof updateTargetBody>;

export const targetSortKeys = ['designation', 'raDeg', 'decDeg', 'updatedAt'] as const;

export const listTargetsQuery = paginationQuery.extend({
  sort: z.enum(targetSortKeys).default('designation'),
  order: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(64).optional(),
  tag: z.string().trim().max(32).optional(),
});
export type ListTargetsQuery = z.output<typeof listTargetsQuery>;

export const targetSchema = z.object({
  id: z.number(),
  projectId: z.number(),
  designation: z.string(),
  raDeg: z.number(),
  decDeg: z.number(),
  notes: z.string(),
  tags: z.array(z.string()),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Target = z.infer<typeof targetSchema>;
