import { z } from 'zod';
import { projectRole } from './roles';

const timeZone = z.string().trim().min(1, 'Enter the time zone.').refine(
  (tz) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: tz });
      return true;
    } catch {
      return false;
    }
  },
  { message: 'Use an IANA time zone such as Etc/UTC or America/Santiago.' },
);

export const siteSchema = z.object({
  name: z.string().trim().min(1, 'Enter the site name.').max(120),
  latitudeDeg: z.number().min(-90, 'Latitude must be ≥ −90°.').max(90, 'Latitude must be ≤ +90°.'),
  longitudeDeg: z.number().min(-180, 'Longitude must be ≥ −180°.').max(180, 'Longitude must be ≤ +180°.'),
  elevationM: z.number().min(-500, 'Elevation must be ≥ −500 m.').max(9000, 'Elevation must be ≤ 9000 m.'),
  timeZone,
});
export type Site = z.infer<typeof siteSchema>;

export const projectCode = z
  .string()
  .trim()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, 'Use 2–16 capital letters, digits or hyphens.');

/** A project's settings, as the lead changes them; create adds defaults, update makes each optional. */
const settingFields = {
  name: z.string().trim().min(1, 'Enter a name.').max(120),
  description: z.string().trim().max(4000),
  site: siteSchema,
  /** R_V = A_V / E(B−V) used to deredden this project's photometry (3.1 for the diffuse interstellar medium, Cardelli, Clayton & Mathis 1989). */
  rV: z.number({ error: 'Enter a number, such as 3.1.' }).min(2, 'Use a value of at least 2.').max(6, 'Use a value of at most 6.'),
};

export const createProjectBody = z.object({
  name: settingFields.name,
  code: projectCode,
  description: settingFields.description.default(''),
  site: settingFields.site,
  rV: settingFields.rV.default(3.1),
  leadEmail: z.string().trim().toLowerCase().email('Enter the lead astronomer’s e-mail.').optional(),
});
export type CreateProjectBody = z.infer<typeof createProjectBody>;

/*
 * Built from the fields without their defaults: zod fills a default even
 * inside optional(), so a partial of createProjectBody would reset the
 * description and R_V on every PATCH that leaves them out.
 */
export const updateProjectBody = z.object(settingFields).partial();
export type UpdateProjectBody = z.infer<typeof updateProjectBody>;

export const projectSchema = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  description: z.string(),
  site: siteSchema,
  rV: z.number(),
  myRole: projectRole.nullable(),
  targetCount: z.number(),
  /** Proposed values waiting for the lead; null for roles that do not see the queue. */
  awaitingReview: z.number().nullable(),
  createdAt: z.string(),
});
export type Project = z.infer<typeof projectSchema>;

export const addMemberBody = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address.'),
  role: projectRole,
});
export type AddMemberBody = z.infer<typeof addMemberBody>;

export const updateMemberBody = z.object({ role: projectRole });
export type UpdateMemberBody = z.infer<typeof updateMemberBody>;

export const memberSchema = z.object({
  userId: z.number(),
  email: z.string(),
  name: z.string(),
  role: projectRole,
  addedAt: z.string(),
});
export type Member = z.infer<typeof memberSchema>;
