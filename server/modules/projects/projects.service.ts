import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CreateProjectBody, Project, UpdateProjectBody } from '../../../shared/schemas/projects';
import { conflict, notFound, validationFailed } from '../../lib/errors';
import { appendTrail } from '../trail/trail.repository';
import { findUserByEmail } from '../users/users.repository';
import { insertMember } from '../members/members.repository';
import { targetIdsOfProject } from '../targets/targets.repository';
import { rederiveTargets } from '../derived-values/derived-values.service';
import {
  findProjectByCode,
  getProjectForUser,
  insertProject,
  listProjectsForMember,
  siteColumns,
  updateProjectRow,
} from './projects.repository';

/** The settings a lead changes, as the trail records them before and after. */
function settingsOf(p: Pick<Project, 'name' | 'description' | 'site' | 'rV'>) {
  return { name: p.name, description: p.description, site: p.site, rV: p.rV };
}

export function createProjectsService(db: Db, clock: Clock) {
  async function get(projectId: number, userId: number): Promise<Project> {
    const project = await getProjectForUser(db, projectId, userId);
    if (!project) throw notFound('No such project.');
    return project;
  }

  return {
    listMine: (userId: number) => listProjectsForMember(db, userId),
    get,

    /** A site admin creates a project; the named lead (if any) becomes its first lead astronomer. */
    async create(input: CreateProjectBody, actorUserId: number): Promise<Project> {
      if (await findProjectByCode(db, input.code)) {
        throw conflict('A project with that code already exists.', [{ path: 'code', message: 'Already in use.' }]);
      }
      const lead = input.leadEmail ? await findUserByEmail(db, input.leadEmail) : undefined;
      if (input.leadEmail && !lead) {
        throw validationFailed([{ path: 'leadEmail', message: 'No account has that e-mail. Create the account first.' }]);
      }
      const projectId = await db.transaction(async (trx) => {
        const now = clock.now();
        const id = await insertProject(trx, input, now);
        await appendTrail(trx, { projectId: id, actorUserId, action: 'project.created', entityType: 'project', entityId: id, after: input }, now);
        if (lead) {
          await insertMember(trx, { projectId: id, userId: lead.id, role: 'lead' }, now);
          await appendTrail(
            trx,
            { projectId: id, actorUserId, action: 'member.added', entityType: 'member', entityId: lead.id, after: { email: lead.email, role: 'lead' } },
            now,
          );
        }
        return id;
      });
      return get(projectId, actorUserId);
    },

    /**
     * Changes a project's settings. R_V scales the extinction every
     * dereddened value rests on (A_V = R_V E(B−V)), so a changed R_V
     * re-derives all the project's targets in the same transaction as the
     * change: the new setting and the proposals it causes land together.
     */
    async update(projectId: number, input: UpdateProjectBody, actorUserId: number): Promise<Project> {
      const current = await get(projectId, actorUserId);
      const before = settingsOf(current);
      const after = settingsOf({ ...before, ...input, site: { ...before.site, ...input.site } });
      const cols: Record<string, unknown> = {};
      if (input.name !== undefined) cols.name = input.name;
      if (input.description !== undefined) cols.description = input.description;
      if (input.site) Object.assign(cols, siteColumns(input.site));
      if (input.rV !== undefined) cols.r_v = input.rV;
      const rVChanged = input.rV !== undefined && input.rV !== before.rV;
      await db.transaction(async (trx) => {
        const now = clock.now();
        await updateProjectRow(trx, projectId, cols, now);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'project.updated', entityType: 'project', entityId: projectId, before, after },
          now,
        );
        if (rVChanged) await rederiveTargets(trx, projectId, await targetIdsOfProject(trx, projectId), actorUserId, now);
      });
      return get(projectId, actorUserId);
    },
  };
}

export type ProjectsService = ReturnType<typeof createProjectsService>;
