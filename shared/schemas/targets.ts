import { z } from 'zod';
import { parseDeclination, parseRightAscension } from '../coordinates';
import { paginationQuery } from './common';
import { LUMINOSITY_CLASSES } from '../physics/main-sequence';
import { derivedStatuses, intervalSchema } from './derived';

/** Luminosity class assumed for the spectroscopic-parallax route (luminosity_hr, distance_photometric). */
export const assumedClass = z.enum(LUMINOSITY_CLASSES);

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

const tagList = z
  .array(z.string().trim().min(1).max(32).regex(/^[\p{L}\p{N}_-]+$/u, 'Tags are single words (letters, digits, - or _).'))
  .max(20);
const tags = tagList.default([]);

/** Coordinates come as strings or numbers; the parsed value is in degrees. */
export const createTargetBody = z.object({
  designation,
  ra: raInput,
  dec: decInput,
  notes: z.string().max(4000).default(''),
  tags,
  assumedClass: assumedClass.default('main_sequence'),
});
export type CreateTargetInput = z.input<typeof createTargetBody>;
export type CreateTargetBody = z.output<typeof createTargetBody>;

export const updateTargetBody = z.object({
  designation: designation.optional(),
  ra: raInput.optional(),
  dec: decInput.optional(),
  notes: z.string().max(4000).optional(),
  // Not `tags.optional()`: zod fills a default even inside optional, so a PATCH without tags would clear them.
  tags: tagList.optional(),
  assumedClass: assumedClass.optional(),
});
export type UpdateTargetBody = z.output<typeof updateTargetBody>;

/** The adopted values the target table shows, one column each; `distance` is the parallax distance, else the photometric one. */
export const tableQuantities = ['temperature', 'spectral_class', 'luminosity', 'radius', 'distance'] as const;
export type TableQuantity = (typeof tableQuantities)[number];

/** The stored derived quantities each table column reads, in order of preference (the server's list and sort both follow it). */
export const tableQuantitySources: Readonly<Record<TableQuantity, readonly string[]>> = {
  temperature: ['temperature'],
  spectral_class: ['spectral_class'],
  luminosity: ['luminosity'],
  radius: ['radius'],
  distance: ['distance_parallax', 'distance_photometric'],
};

export const targetSortKeys = ['designation', 'raDeg', 'decDeg', 'updatedAt', ...tableQuantities] as const;

export const listTargetsQuery = paginationQuery.extend({
  sort: z.enum(targetSortKeys).default('designation'),
  order: z.enum(['asc', 'desc']).default('asc'),
  q: z.string().trim().max(64).optional(),
  tag: z.string().trim().max(32).optional(),
  /** Only targets with proposed values waiting for the lead. */
  awaiting: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
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
  assumedClass,
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Target = z.infer<typeof targetSchema>;

/** One adopted value in the target table: the newest approved or proposed revision (readers: approved only). */
export const tableValueSchema = z.object({
  /** The stored quantity shown (for distance: distance_parallax or distance_photometric). */
  quantity: z.string(),
  value: z.number(),
  uncertainty: z.number(),
  interval: intervalSchema.nullable(),
  unit: z.string(),
  label: z.string().nullable(),
  status: z.enum(derivedStatuses),
});
export type TableValue = z.infer<typeof tableValueSchema>;

export const targetRowSchema = targetSchema.extend({
  values: z.partialRecord(z.enum(tableQuantities), tableValueSchema),
  awaitingReview: z.number(),
});
export type TargetRow = z.infer<typeof targetRowSchema>;
