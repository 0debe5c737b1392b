import { z } from 'zod';

export const derivedStatuses = ['proposed', 'approved', 'rejected', 'superseded'] as const;
export type DerivedStatus = (typeof derivedStatuses)[number];

export const warningSchema = z.object({ code: z.string(), quantity: z.string(), message: z.string(), limit: z.string().optional() });

export const derivedValueSchema = z.object({
  id: z.number(),
  targetId: z.number(),
  quantity: z.string(),
  value: z.number(),
  uncertainty: z.number(),
  unit: z.string(),
  label: z.string().nullable(),
  method: z.string(),
  methodLabel: z.string(),
  inputs: z.array(z.union([z.number(), z.string()])),
  constants: z.array(z.string()),
  warnings: z.array(warningSchema),
  revision: z.number(),
  status: z.enum(derivedStatuses),
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
