import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import type { CreateTargetBody, ListTargetsQuery, Target, TargetRow, UpdateTargetBody } from '../../../shared/schemas/targets';
import { roleCan, type ProjectRole } from '../../../shared/schemas/roles';
import type { Page } from '../../../shared/schemas/common';
import { designationKey } from '../../../shared/coordinates';
import { conflict, notFound } from '../../lib/errors';
import { appendTrail, appendTrailMany } from '../trail/trail.repository';
import { rederiveTargets } from '../derived-values/derived-values.service';
import {
  deleteTargetRow,
  findTarget,
  findTargetIdByKey,
  insertTarget,
  insertTargets,
  listTargets,
  updateTargetRow,
  type ValueView,
} from './targets.repository';

const duplicate = (designation: string) =>
  conflict(`A target called "${designation}" already exists in this project (designations ignore case and spaces).`, [
    { path: 'designation', message: 'Already used in this project.' },
  ]);

/**
 * What a role sees of the derived values in the target table (the
 * `readProposed` permission, shared/schemas/roles.ts). Readers see
 * only what the lead astronomer signed (PRODUCT.md, roles); every other
 * member also sees the newest proposal, marked "proposed", so the team
 * works on fresh numbers while the sign-off is pending.
 */
export function valueViewFor(role: ProjectRole): ValueView {
  return roleCan(role, 'readProposed')
    ? { shownStatuses: ['proposed', 'approved'], countProposals: true }
    : { shownStatuses: ['approved'], countProposals: false };
}

/**
 * Creates the targets a file introduces, inside the caller's transaction,
 * each with the `target.created` trail entry a target made by hand gets
 * (saying which upload and row it came from). Returns their ids by
 * designation key.
 */
export async function addTargetsFromUpload(
  trx: Db,
  projectId: number,
  uploadId: number,
  targets: { designation: string; designationKey: string; raDeg: number; decDeg: number; row: number }[],
  actorUserId: number,
  at: Date,
): Promise<Map<string, number>> {
  if (targets.length === 0) return new Map();
  const ids = await insertTargets(trx, projectId, targets, at);
  await appendTrailMany(
    trx,
    targets.map((t) => {
      const targetId = ids.get(t.designationKey)!;
      return {
        projectId,
        actorUserId,
        action: 'target.created',
        entityType: 'target',
        entityId: targetId,
        targetId,
        after: { designation: t.designation, ra: t.raDeg, dec: t.decDeg, uploadId, row: t.row },
      };
    }),
    at,
  );
  return ids;
}

export function createTargetsService(db: Db, clock: Clock) {
  async function get(projectId: number, targetId: number): Promise<Target> {
    const target = await findTarget(db, projectId, targetId);
    if (!target) throw notFound('No such target in this project.');
    return target;
  }

  return {
    /**
     * A page of targets with their adopted values as `role` may see them.
     * A reader asking for targets awaiting review gets none: proposals are
     * not shown to readers, so none of their rows awaits anything.
     */
    async list(projectId: number, role: ProjectRole, query: ListTargetsQuery): Promise<Page<TargetRow>> {
      const view = valueViewFor(role);
      if (query.awaiting && !view.countProposals) return { items: [], total: 0, page: query.page, pageSize: query.pageSize };
      return listTargets(db, projectId, query, view);
    },
    get,

    async create(projectId: number, input: CreateTargetBody, actorUserId: number): Promise<Target> {
      const key = designationKey(input.designation);
      const id = await db.transaction(async (trx) => {
        if (await findTargetIdByKey(trx, projectId, key)) throw duplicate(input.designation);
        const now = clock.now();
        const newId = await insertTarget(
          trx,
          {
            projectId,
            designation: input.designation,
            designationKey: key,
            raDeg: input.ra,
            decDeg: input.dec,
            notes: input.notes,
            tags: input.tags,
            assumedClass: input.assumedClass,
          },
          now,
        );
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'target.created', entityType: 'target', entityId: newId, targetId: newId, after: input },
          now,
        );
        return newId;
      });
      return get(projectId, id);
    },

    /**
     * Edits a target. A changed assumed luminosity class changes what the
     * spectroscopic-parallax route derives (luminosity for the class, the
     * photometric distance), so the target is re-derived in the same
     * transaction: the edit and its new proposals land together or not at all.
     */
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
      if (input.assumedClass !== undefined) cols.assumed_class = input.assumedClass;
      const classChanged = input.assumedClass !== undefined && input.assumedClass !== before.assumedClass;
      await db.transaction(async (trx) => {
        if (cols.designation_key) {
          const clash = await findTargetIdByKey(trx, projectId, cols.designation_key as string);
          if (clash && clash !== targetId) throw duplicate(input.designation!);
        }
        const now = clock.now();
        await updateTargetRow(trx, targetId, cols, now);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'target.updated', entityType: 'target', entityId: targetId, targetId, before, after: input },
          now,
        );
        if (classChanged) await rederiveTargets(trx, projectId, [targetId], actorUserId, now);
      });
      return get(projectId, targetId);
    },

    async remove(projectId: number, targetId: number, actorUserId: number): Promise<void> {
      const before = await get(projectId, targetId);
      await db.transaction(async (trx) => {
        await deleteTargetRow(trx, targetId);
        await appendTrail(
          trx,
          { projectId, actorUserId, action: 'target.deleted', entityType: 'target', entityId: targetId, targetId, before },
          clock.now(),
        );
      });
    },
  };
}

export type TargetsService = ReturnType<typeof createTargetsService>;
