import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CreateTargetBody, ListTargetsQuery, Target, UpdateTargetBody } from '../../../shared/schemas/targets';
import { designationKey } from '../../../shared/coordinates';
import { conflict, notFound } from '../../lib/errors';
import { appendTrail } from '../trail/trail.repository';
import { deleteTargetRow, findTarget, findTargetIdByKey, insertTarget, listTargets, updateTargetRow } from './targets.repository';

const duplicate = (designation: string) =>
  conflict(`A target called "${designation}" already exists in this project (designations ignore case and spaces).`, [
    { path: 'designation', message: 'Already used in this project.' },
  ]);

export function createTargetsService(db: Db, clock: Clock) {
  async function get(projectId: number, targetId: number): Promise<Target> {
    const target = await findTarget(db, projectId, targetId);
    if (!target) throw notFound('No such target in this project.');
    return target;
  }

  return {
    list: (projectId: number, query: ListTargetsQuery) => listTargets(db, projectId, query),
    get,

    async create(projectId: number, input: CreateTargetBody, actorUserId: number): Promise<Target> {
      const key = designationKey(input.designation);
      const id = await db.transaction(async (trx) => {
        if (await findTargetIdByKey(trx, projectId, key)) throw duplicate(input.designation);
        const now = clock.now();
        const newId = await insertTarget(
          trx,
          { projectId, designation: input.designation, designationKey: key, raDeg: input.ra, decDeg: input.dec, notes: input.notes, tags: input.tags },
          now,
        );
        await appendTrail(trx, { projectId, actorUserId, action: 'target.created', entityType: 'target', entityId: newId, targetId: newId, after: input }, now);
        return newId;
      });
      return get(projectId, id);
    },

    async update(projectId: number, targetId: number, input: UpdateTargetBody, actorUserId: number): Promise<Target> {
      const before = await get(projectId, targetId);
      const cols: Record<string, unknown> = {};
      if (input.designation !== undefined) {
        cols.designation = input.designation;
        cols.designation_key = designationKey(input.designation);
      }
      if (input.ra !== undefined) cols.ra_deg = input.ra;
      if (input.dec !== undefined) cols.dec_deg = input.dec;
      if (input.notes !== undefined) cols.notes = input.notes;
      if (input.tags !== undefined) cols.tags = JSON.stringify(input.tags);
      await db.transaction(async (trx) => {
        if (cols.designation_key) {
          const clash = await findTargetIdByKey(trx, projectId, cols.designation_key as string);
          if (clash && clash !== targetId) throw duplicate(input.designation!);
        }
        const now = clock.now();
        await updateTargetRow(trx, targetId, cols, now);
        await appendTrail(trx, { projectId, actorUserId, action: 'target.updated', entityType: 'target', entityId: targetId, targetId, before, after: input }, now);
      });
      return get(projectId, targetId);
    },

    async remove(projectId: number, targetId: number, actorUserId: number): Promise<void> {
      const before = await get(projectId, targetId);
      await db.transaction(async (trx) => {
        await deleteTargetRow(trx, targetId);
        await appendTrail(trx, { projectId, actorUserId, action: 'target.deleted', entityType: 'target', entityId: targetId, targetId, before }, clock.now());
      });
    },
  };
}

export type TargetsService = ReturnType<typeof createTargetsService>;
