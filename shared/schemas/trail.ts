import { z } from 'zod';
import { paginationQuery } from './common';

/** One entry of the review trail, as the trail page and the export show it. */
export const trailEntrySchema = z.object({
  id: z.number(),
  projectId: z.number().nullable(),
  actor: z.object({ id: z.number(), name: z.string() }).nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.number().nullable(),
  targetId: z.number().nullable(),
  targetDesignation: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
  note: z.string(),
  /** UTC, ISO 8601. */
  createdAt: z.string(),
});
export type TrailEntry = z.infer<typeof trailEntrySchema>;

const isoDate = z.string().trim().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD.');

/** Filters of the trail page and its export; `from` and `to` are UTC dates, both inclusive. */
export const trailFilters = z.object({
  actorId: z.coerce.number().int().positive().optional(),
  action: z.string().trim().max(64).optional(),
  targetId: z.coerce.number().int().positive().optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
});
export type TrailFilters = z.output<typeof trailFilters>;
export const listTrailQuery = paginationQuery.extend(trailFilters.shape);
export type ListTrailQuery = z.output<typeof listTrailQuery>;
export const exportTrailQuery = trailFilters.extend({ format: z.enum(['csv', 'json']).default('csv') });

export const trailPageSchema = z.object({ items: z.array(trailEntrySchema), total: z.number(), page: z.number(), pageSize: z.number() });
export type TrailPage = z.infer<typeof trailPageSchema>;

/** Recent activity across the caller's projects (home page). */
export const activityQuery = z.object({ limit: z.coerce.number().int().min(1).max(50).default(15) });
export const activityEntrySchema = trailEntrySchema.extend({ projectCode: z.string().nullable() });
export type ActivityEntry = z.infer<typeof activityEntrySchema>;
