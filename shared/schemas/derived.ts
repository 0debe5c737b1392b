import { z } from 'zod';
import { paginationQuery } from './common';

export const derivedStatuses = ['proposed', 'approved', 'rejected', 'superseded'] as const;
export type DerivedStatus = (typeof derivedStatuses)[number];

export const warningSchema = z.object({ code: z.string(), quantity: z.string(), message: z.string(), limit: z.string().optional() });

export const intervalSchema = z.object({ low: z.number(), high: z.number() });

export const derivedValueSchema = z.object({
  id: z.number(),
  targetId: z.number(),
  quantity: z.string(),
  value: z.number(),
  uncertainty: z.number(),
  /** The 68 % interval (SI) where its arms differ, printed +a/−b; null where ±σ says it. */
  interval: intervalSchema.nullable(),
  unit: z.string(),
  label: z.string().nullable(),
  method: z.string(),
  methodLabel: z.string(),
  inputs: z.array(z.union([z.number(), z.string()])),
  constants: z.array(z.string()),
  warnings: z.array(warningSchema),
  /** Derived quantities this revision was computed from (its upstream in the derivation graph). */
  dependsOn: z.array(z.string()),
  revision: z.number(),
  /** Grows by one at every change of status; approve and reject must name the version they saw. */
  version: z.number(),
  status: z.enum(derivedStatuses),
  proposedBy: z.string().nullable(),
  reviewer: z.string().nullable(),
  reviewNote: z.string(),
  reviewedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type DerivedValue = z.infer<typeof derivedValueSchema>;

export const listDerivedQuery = z.object({
  include: z.enum(['current', 'all']).default('current'),
});

export const measurementSchema = z.object({
  id: z.number(),
  targetId: z.number(),
  uploadId: z.number().nullable(),
  rowNumber: z.number().nullable(),
  kind: z.string(),
  valueSi: z.number(),
  uncertaintySi: z.number().nullable(),
  unitSi: z.string(),
  valueAsSent: z.number(),
  uncertaintyAsSent: z.number().nullable(),
  unitAsSent: z.string().nullable(),
  band: z.string().nullable(),
  restWavelengthSi: z.number().nullable(),
  landeG: z.number().nullable(),
  observedAt: z.string().nullable(),
  instrument: z.string().nullable(),
  note: z.string(),
  extra: z.record(z.string(), z.string()),
  observer: z.string().nullable(),
  createdAt: z.string(),
});
export type Measurement = z.infer<typeof measurementSchema>;

/** One value the lead decides on, with the version it was seen at. */
export const reviewItem = z.object({ id: z.number().int().positive(), version: z.number().int().positive() });

/**
 * Approve or reject one or more proposed values with one note. A rejection
 * needs a note. Approving a value also approves, in the same transaction, the
 * proposed upstream values it was computed from (listed in the queue as
 * `upstream`), so a reader never sees a value resting on unapproved ones.
 */
export const reviewBody = z
  .object({
    decision: z.enum(['approve', 'reject']),
    items: z.array(reviewItem).min(1, 'Choose at least one value.').max(500, 'Decide on at most 500 values at once.'),
    note: z.string().trim().max(2000).default(''),
  })
  .superRefine((b, ctx) => {
    if (b.decision === 'reject' && b.note.length === 0) ctx.addIssue({ code: 'custom', path: ['note'], message: 'Say why the values are rejected.' });
  });
export type ReviewBody = z.output<typeof reviewBody>;
export type ReviewInput = z.input<typeof reviewBody>;

export const reviewResultSchema = z.object({
  /** Every value whose status changed: the chosen ones and the upstream values approved with them. */
  decided: z.array(derivedValueSchema),
  /** Approved values their approved successors superseded. */
  superseded: z.array(z.number()),
});
export type ReviewResult = z.infer<typeof reviewResultSchema>;

/**
 * The 409 a stale decision gets: `details` lists, per value that changed since
 * the lead saw it, what it is now (`current` is the value's newest revision).
 */
export const staleValueDetail = z.object({
  id: z.number(),
  quantity: z.string(),
  targetId: z.number(),
  seenVersion: z.number(),
  message: z.string(),
  current: derivedValueSchema.nullable(),
});
export type StaleValueDetail = z.infer<typeof staleValueDetail>;

/** Where one input measurement of a value came from. */
export const inputProvenanceSchema = z.object({
  measurementId: z.number(),
  kind: z.string(),
  band: z.string().nullable(),
  uploadId: z.number().nullable(),
  uploadFilename: z.string().nullable(),
  rowNumber: z.number().nullable(),
});
export type InputProvenance = z.infer<typeof inputProvenanceSchema>;

export const upstreamValueSchema = z.object({ id: z.number(), quantity: z.string(), revision: z.number(), version: z.number() });

/** One proposed value in the review queue, beside the approved value it would replace. */
export const queueItemSchema = z.object({
  target: z.object({ id: z.number(), designation: z.string() }),
  proposed: derivedValueSchema,
  approved: derivedValueSchema.nullable(),
  /** Proposed upstream values that approving this one approves with it. */
  upstream: z.array(upstreamValueSchema),
  provenance: z.array(inputProvenanceSchema),
});
export type QueueItem = z.infer<typeof queueItemSchema>;

export const reviewQueueQuery = paginationQuery.extend({
  targetId: z.coerce.number().int().positive().optional(),
  quantity: z.string().trim().max(48).optional(),
  warnings: z.enum(['any', 'with', 'without']).default('any'),
});
export type ReviewQueueQuery = z.output<typeof reviewQueueQuery>;

/** Items are ordered by target designation, then by the derivation table's order, so a page groups by target. */
export const reviewQueueSchema = z.object({
  items: z.array(queueItemSchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
});
export type ReviewQueue = z.infer<typeof reviewQueueSchema>;

/** Re-run the derivations of one target, or of the whole project when targetId is omitted. */
export const rederiveBody = z.object({ targetId: z.number().int().positive().optional() });
export const rederiveResultSchema = z.object({ targets: z.number(), proposed: z.number() });
export type RederiveResult = z.infer<typeof rederiveResultSchema>;

/** The project's values as a file: CSV or a VOTable; readers get approved values whatever they ask. */
export const exportValuesQuery = z.object({
  format: z.enum(['csv', 'votable']).default('csv'),
  include: z.enum(['approved', 'proposed']).default('approved'),
});
export type ExportValuesQuery = z.output<typeof exportValuesQuery>;
