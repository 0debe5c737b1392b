import { z } from 'zod';

/** Per-project roles, as in PRODUCT.md ("People and roles"). */
export const projectRoles = ['observer', 'lead', 'reader', 'pi'] as const;
export const projectRole = z.enum(projectRoles);
export type ProjectRole = z.infer<typeof projectRole>;

/** What a role may do inside a project. The server's access middleware and the client's controls both read this one table. */
export const permissions = {
  read: ['observer', 'lead', 'reader', 'pi'],
  editTargets: ['observer', 'lead'],
  upload: ['observer', 'lead'],
  comment: ['observer', 'lead'],
  review: ['lead'],
  /** See what awaits review (observers read the queue, only the lead decides). */
  readQueue: ['observer', 'lead'],
  rederive: ['observer', 'lead'],
  /** Proposed (not yet approved) values: everyone but readers, who see approved values only. */
  readProposed: ['observer', 'lead', 'pi'],
  /** The trail carries proposed values, which readers are not shown. */
  readTrail: ['observer', 'lead', 'pi'],
  manageMembers: ['lead'],
  manageSettings: ['lead'],
  manageSummary: ['lead', 'pi'],
} as const satisfies Record<string, readonly ProjectRole[]>;

export type Permission = keyof typeof permissions;

export function roleCan(role: ProjectRole | null | undefined, permission: Permission): boolean {
  return role != null && (permissions[permission] as readonly ProjectRole[]).includes(role);
}

export const roleLabels: Record<ProjectRole, string> = {
  observer: 'Observer',
  lead: 'Lead astronomer',
  reader: 'Reader',
  pi: 'PI',
};
