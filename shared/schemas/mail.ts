import { z } from 'zod';

/** ISO weekdays, 1 = Monday … 7 = Sunday, as the summary schedule stores them. */
export const weekdayNames = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

export const summarySchedule = z.object({
  enabled: z.boolean({ error: 'Say whether the summary is sent.' }),
  weekday: z.number({ error: 'Choose a weekday.' }).int().min(1, 'Choose a weekday.').max(7, 'Choose a weekday.'),
  time: z
    .string()
    .trim()
    .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a 24-hour time such as 08:00.'),
});
export type SummarySchedule = z.infer<typeof summarySchedule>;

export const updateSummaryScheduleBody = summarySchedule;

export const summarySettingsSchema = z.object({
  schedule: summarySchedule,
  /** The site's time zone, in which the schedule is read. */
  timeZone: z.string(),
  /** The next scheduled sending, or null when the summary is off. */
  nextRunAt: z.string().nullable(),
  /** Who receives it: the PIs, and the members who asked for it. */
  recipients: z.array(z.object({ name: z.string(), email: z.string(), reason: z.enum(['pi', 'opted_in']) })),
  /** The ISO week a summary would be sent for now, and when that week's was queued if it was. */
  week: z.string(),
  weekQueuedAt: z.string().nullable(),
});
export type SummarySettings = z.infer<typeof summarySettingsSchema>;

export const summaryPreviewSchema = z.object({
  week: z.string(),
  periodStart: z.string(),
  periodEnd: z.string(),
  subject: z.string(),
  html: z.string(),
  text: z.string(),
  empty: z.boolean(),
});
export type SummaryPreview = z.infer<typeof summaryPreviewSchema>;

export const sendSummaryResultSchema = z.object({
  week: z.string(),
  /** Messages queued by this request. */
  queued: z.number(),
  /** Recipients who already had this week's summary queued (a week's summary goes out once). */
  alreadyQueued: z.number(),
});
export type SendSummaryResult = z.infer<typeof sendSummaryResultSchema>;

export const mailPreferenceSchema = z.object({
  projectId: z.number(),
  projectName: z.string(),
  projectCode: z.string(),
  role: z.string(),
  /** PIs receive the summary whatever they choose here. */
  weeklySummary: z.boolean(),
  summaryAlways: z.boolean(),
  reviewNotice: z.boolean(),
});
export type MailPreference = z.infer<typeof mailPreferenceSchema>;

export const updateMailPreferenceBody = z
  .object({
    weeklySummary: z.boolean({ error: 'Say yes or no.' }).optional(),
    reviewNotice: z.boolean({ error: 'Say yes or no.' }).optional(),
  })
  .refine((b) => b.weeklySummary !== undefined || b.reviewNotice !== undefined, { message: 'Nothing to change.' });
export type UpdateMailPreferenceBody = z.infer<typeof updateMailPreferenceBody>;

/** One message the local mail fake caught, as the site admin's mail page lists it. */
export const caughtMailSummarySchema = z.object({
  id: z.number(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  receivedAt: z.string(),
  hasHtml: z.boolean(),
});
export const caughtMailSchema = caughtMailSummarySchema.extend({ text: z.string(), html: z.string().nullable() });
export type CaughtMailSummary = z.infer<typeof caughtMailSummarySchema>;
export type CaughtMail = z.infer<typeof caughtMailSchema>;
