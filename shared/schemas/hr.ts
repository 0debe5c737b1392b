import { z } from 'zod';
import { derivedStatuses } from './derived';

/** Which values the HR diagram plots: approved only, or each quantity's newest proposal where one is newer. */
export const hrQuery = z.object({
  include: z.enum(['approved', 'proposed']).default('approved'),
});
export type HrQuery = z.infer<typeof hrQuery>;

const hrValue = z.object({
  /** SI: K for the temperature, W for the luminosity. */
  value: z.number(),
  sigma: z.number(),
  status: z.enum(derivedStatuses),
});

/** One target on the diagram: its adopted temperature and luminosity, and the class read from them. */
export const hrStarSchema = z.object({
  id: z.number(),
  designation: z.string(),
  tags: z.array(z.string()),
  temperature: hrValue,
  luminosity: hrValue,
  /** The luminosity class label the engine derived ("main sequence (V)", or several within 1σ), when it could. */
  luminosityClass: z.string().nullable(),
});
export type HrStar = z.infer<typeof hrStarSchema>;

export const hrDiagramSchema = z.object({
  include: z.enum(['approved', 'proposed']),
  stars: z.array(hrStarSchema),
});
export type HrDiagram = z.infer<typeof hrDiagramSchema>;
