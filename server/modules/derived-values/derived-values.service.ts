import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { AppError, notFound } from '../../lib/errors';
import { deriveAll, type DerivedResult } from '../../../shared/physics/derive';
import type { LuminosityClassName } from '../../../shared/physics/main-sequence';
import { QUANTITY_IDS } from '../../../shared/physics/quantities';
import { targetSeed } from '../../../shared/physics/random';
import type {
  DerivedValue,
  ExportValuesQuery,
  QueueItem,
  RederiveResult,
  ReviewBody,
  ReviewQueue,
  ReviewQueueQuery,
  ReviewResult,
  StaleValueDetail,
} from '../../../shared/schemas/derived';
import type { HrDiagram, HrQuery, HrStar } from '../../../shared/schemas/hr';
import { roleCan, type ProjectRole } from '../../../shared/schemas/roles';
import type { Download } from '../../lib/download';
import { getProjectForUser } from '../projects/projects.repository';
import { csvChunks, votableChunks } from './values-export';
import { engineInputsFor } from '../measurements/measurements.repository';
import { findTarget } from '../targets/targets.repository';
import { appendTrail, appendTrailMany, type TrailEntry } from '../trail/trail.repository';
import { enqueueReviewNotices } from '../mail-preferences/review-notice';
import {
  approvedRevisions,
  decide,
  derivationSettings,
  eachExportBatch,
  findDerivedInProject,
  hrRevisions,
  idsOfRevisions,
  insertDerivedRows,
  latestRevisions,
  listDerived,
  projectTargetIds,
  proposedPage,
  provenanceOf,
  supersedeApprovedBefore,
  supersedeProposals,
  toDerivedValue,
  type DerivedRow,
  type HrRow,
  type NamedDerivedRow,
  type NewDerivedRow,
} from './derived-values.repository';

function sameAs(row: DerivedRow, r: DerivedResult): boolean {
  return (
    row.value === r.value &&
    row.uncertainty === r.uncertainty &&
    row.interval_low === (r.interval?.low ?? null) &&
    row.interval_high === (r.interval?.high ?? null) &&
    row.label === (r.label ?? null) &&
    row.method === r.method.id &&
    row.inputs_json === JSON.stringify(r.inputs) &&
    row.warnings_json === JSON.stringify(r.warnings)
  );
}

/** What a trail entry keeps of a value: enough to read the change without the database. */
function summary(row: Pick<DerivedRow, 'quantity' | 'revision' | 'value' | 'uncertainty' | 'unit' | 'label' | 'status'>) {
  return { quantity: row.quantity, revision: row.revision, value: row.value, uncertainty: row.uncertainty, unit: row.unit, label: row.label, status: row.status };
}

/**
 * Re-derives the given targets from all their measurements, with the
 * project's R_V and each target's assumed luminosity class, and proposes a
 * new revision of every quantity whose value, inputs or warnings changed
 * (compared with its newest revision, whatever its status: a re-run does not
 * re-propose what the lead just rejected unless something changed). An
 * earlier proposal that was never reviewed is superseded by the new one; an
 * approved value stays approved until the lead approves its successor.
 * Every proposal and supersession is written to the trail. Runs inside the
 * caller's transaction.
 */
export async function rederiveTargets(trx: Db, projectId: number, targetIds: number[], actorUserId: number, at: Date): Promise<{ proposed: number }> {
  if (targetIds.length === 0) return { proposed: 0 };
  const inputs = await engineInputsFor(trx, targetIds);
  const latest = await latestRevisions(trx, targetIds);
  const settings = await derivationSettings(trx, projectId, targetIds);
  const toInsert: NewDerivedRow[] = [];
  const superseded: DerivedRow[] = [];
  const created = at.toISOString();
  for (const targetId of targetIds) {
    const assumedClass = settings.assumedClass.get(targetId) as LuminosityClassName | undefined;
    const graph = deriveAll(inputs.get(targetId) ?? [], { rV: settings.rV, assumedClass, seed: targetSeed(projectId, targetId) });
    for (const result of Object.values(graph.results)) {
      if (!result) continue;
      const previous = latest.get(`${targetId}:${result.quantity}`);
      if (previous && sameAs(previous, result)) continue;
      if (previous?.status === 'proposed') superseded.push(previous);
      toInsert.push({
        project_id: projectId,
        target_id: targetId,
        quantity: result.quantity,
        value: result.value,
        uncertainty: result.uncertainty,
        interval_low: result.interval?.low ?? null,
        interval_high: result.interval?.high ?? null,
        unit: result.unit,
        label: result.label ?? null,
        method: result.method.id,
        method_label: result.method.label,
        inputs_json: JSON.stringify(result.inputs),
        constants_json: JSON.stringify(result.constants),
        warnings_json: JSON.stringify(result.warnings),
        depends_on_json: JSON.stringify(result.dependsOn),
        revision: (previous?.revision ?? 0) + 1,
        status: 'proposed',
        proposed_by_user_id: actorUserId,
        created_at: created,
      });
    }
  }
  await supersedeProposals(
    trx,
    superseded.map((r) => r.id),
  );
  await insertDerivedRows(trx, toInsert);
  const ids = await idsOfRevisions(trx, toInsert);
  const entries: TrailEntry[] = [
    ...superseded.map((r) => ({
      projectId,
      actorUserId,
      action: 'value.superseded',
      entityType: 'derived_value',
      entityId: r.id,
      targetId: r.target_id,
      before: summary(r),
      after: { status: 'superseded', by: 'a newer proposal' },
    })),
    ...toInsert.map((r) => ({
      projectId,
      actorUserId,
      action: 'value.proposed',
      entityType: 'derived_value',
      entityId: ids.get(`${r.target_id}:${r.quantity}:${r.revision}`) ?? null,
      targetId: r.target_id,
      after: summary(r),
    })),
  ];
  await appendTrailMany(trx, entries, at);
  return { proposed: toInsert.length };
}

const key = (r: { target_id: number; quantity: string }) => `${r.target_id}:${r.quantity}`;

/**
 * The proposed upstream revisions that approving `row` must approve with it,
 * climbing the derivation graph through proposals (an approved upstream value
 * already rests on approved ones). A value resting on a rejected or missing
 * upstream value cannot be approved: the problem is returned instead.
 */
function upstreamOf(row: DerivedRow, latest: Map<string, DerivedRow>): { proposed: DerivedRow[]; problem: string | null } {
  const proposed = new Map<number, DerivedRow>();
  const pending = [row];
  while (pending.length > 0) {
    const current = pending.pop()!;
    for (const quantity of JSON.parse(current.depends_on_json) as string[]) {
      const upstream = latest.get(`${row.target_id}:${quantity}`);
      if (!upstream) return { proposed: [], problem: `it was computed from ${quantity}, which has no revision any more` };
      if (upstream.status === 'approved' || proposed.has(upstream.id)) continue;
      if (upstream.status !== 'proposed') {
        return { proposed: [], problem: `it was computed from ${quantity} revision ${upstream.revision}, which is ${upstream.status}; re-run the derivations or reject it too` };
      }
      proposed.set(upstream.id, upstream);
      pending.push(upstream);
    }
  }
  return { proposed: [...proposed.values()], problem: null };
}

export function createDerivedValuesService(db: Db, clock: Clock, options: { publicUrl?: string } = {}) {
  async function requireTarget(projectId: number, targetId: number) {
    if (!(await findTarget(db, projectId, targetId))) throw notFound('No such target in this project.');
  }

  /** Mails the people who proposed the decided values and asked to hear of it, in the review's transaction. */
  async function notifyProposers(trx: Db, projectId: number, reviewerUserId: number, decision: 'approved' | 'rejected', note: string, decided: NamedDerivedRow[], at: Date) {
    if (!decided.some((r) => r.proposed_by_user_id !== null && r.proposed_by_user_id !== reviewerUserId)) return;
    const project = await trx('projects').where({ id: projectId }).first('name');
    const reviewer = await trx('users').where({ id: reviewerUserId }).first('name');
    const designations = new Map<number, string>(
      (await trx('targets').whereIn('id', [...new Set(decided.map((r) => r.target_id))]).select('id', 'designation')).map((t: { id: number; designation: string }) => [t.id, t.designation]),
    );
    await enqueueReviewNotices(trx, {
      projectId,
      projectName: project?.name ?? '',
      reviewerUserId,
      reviewerName: reviewer?.name ?? 'The lead astronomer',
      decision,
      note,
      at,
      publicUrl: options.publicUrl ?? 'http://localhost:3000',
      values: decided.map((r) => ({
        id: r.id,
        version: r.version,
        targetId: r.target_id,
        designation: designations.get(r.target_id) ?? '',
        quantity: r.quantity,
        value: r.value,
        uncertainty: r.uncertainty,
        label: r.label,
        proposedByUserId: r.proposed_by_user_id,
      })),
    });
  }

  return {
    /** A target's derived values; readers (students, guests) see approved values only (PRODUCT.md, roles). */
    async list(projectId: number, targetId: number, include: 'current' | 'all', role: ProjectRole): Promise<DerivedValue[]> {
      await requireTarget(projectId, targetId);
      const all = await listDerived(db, projectId, targetId, include);
      return roleCan(role, 'readProposed') ? all : all.filter((d) => d.status === 'approved');
    },

    async queue(projectId: number, query: ReviewQueueQuery): Promise<ReviewQueue> {
      const { rows, total } = await proposedPage(db, projectId, query);
      const targetIds = [...new Set(rows.map((r) => r.target_id))];
      const [latest, approved] = await Promise.all([latestRevisions(db, targetIds), approvedRevisions(db, targetIds)]);
      const measurementIds = [...new Set(rows.flatMap((r) => (JSON.parse(r.inputs_json) as unknown[]).filter((id): id is number => typeof id === 'number')))];
      const provenance = await provenanceOf(db, measurementIds);
      const items: QueueItem[] = rows.map((r) => {
        const current = approved.get(key(r));
        const proposed = toDerivedValue(r);
        return {
          target: { id: r.target_id, designation: r.designation },
          proposed,
          approved: current ? toDerivedValue(current) : null,
          upstream: upstreamOf(r, latest).proposed.map((u) => ({ id: u.id, quantity: u.quantity, revision: u.revision, version: u.version })),
          provenance: proposed.inputs.flatMap((id) => (typeof id === 'number' && provenance.has(id) ? [provenance.get(id)!] : [])),
        };
      });
      return { items, total, page: query.page, pageSize: query.pageSize };
    },

    /**
     * Approves or rejects the chosen proposals in one transaction. Every
     * chosen value must still be proposed at the version the lead saw, or
     * nothing changes and the answer (409 stale_value) says what each is now.
     * Approving also approves the proposed upstream values each was computed
     * from, and supersedes the approved revisions they replace.
     */
    async review(projectId: number, reviewerUserId: number, body: ReviewBody): Promise<ReviewResult> {
      return db.transaction(async (trx) => {
        const now = clock.now();
        const ids = [...new Set(body.items.map((i) => i.id))];
        const rows = await findDerivedInProject(trx, projectId, ids);
        const byId = new Map(rows.map((r) => [r.id, r]));
        const missing = ids.filter((id) => !byId.has(id));
        if (missing.length > 0) throw notFound(`No derived value ${missing.join(', ')} in this project.`);

        const latest = await latestRevisions(trx, [...new Set(rows.map((r) => r.target_id))]);
        const stale: StaleValueDetail[] = [];
        for (const item of body.items) {
          const row = byId.get(item.id)!;
          if (row.version === item.version && row.status === 'proposed') continue;
          const newest = latest.get(key(row));
          const newestNamed = newest && newest.id !== row.id ? (await findDerivedInProject(trx, projectId, [newest.id]))[0] : row;
          stale.push({
            id: row.id,
            quantity: row.quantity,
            targetId: row.target_id,
            seenVersion: item.version,
            message:
              row.status === 'proposed'
                ? `${row.quantity} revision ${row.revision} changed since you saw it.`
                : `${row.quantity} revision ${row.revision} is now ${row.status}${newest && newest.id !== row.id ? `; the newest is revision ${newest.revision} (${newest.status})` : ''}.`,
            current: newestNamed ? toDerivedValue(newestNamed) : null,
          });
        }
        if (stale.length > 0) throw new AppError(409, 'stale_value', stale.map((s) => s.message).join(' '), stale);

        const decision = body.decision === 'approve' ? 'approved' : 'rejected';
        const toDecide = new Map<number, DerivedRow>(rows.map((r) => [r.id, r]));
        const seen = new Map(body.items.map((i) => [i.id, i.version]));
        if (decision === 'approved') {
          const problems: { id: number; quantity: string; message: string }[] = [];
          for (const row of rows) {
            const { proposed, problem } = upstreamOf(row, latest);
            if (problem) problems.push({ id: row.id, quantity: row.quantity, message: `${row.quantity} cannot be approved: ${problem}.` });
            for (const u of proposed) {
              if (!toDecide.has(u.id)) {
                toDecide.set(u.id, u);
                seen.set(u.id, u.version);
              }
            }
          }
          if (problems.length > 0) throw new AppError(409, 'upstream_not_approvable', problems.map((p) => p.message).join(' '), problems);
        }

        const entries: TrailEntry[] = [];
        const superseded: number[] = [];
        // The derivation table lists every quantity after those it rests on, so the trail reads upstream first.
        const order = (q: string) => (QUANTITY_IDS as readonly string[]).indexOf(q);
        const ordered = [...toDecide.values()].sort((a, b) => a.target_id - b.target_id || order(a.quantity) - order(b.quantity));
        const chosen = new Set(ids);
        for (const row of ordered) {
          if (!(await decide(trx, row.id, seen.get(row.id)!, { status: decision, reviewerUserId, note: body.note, at: now }))) {
            // Someone decided it between our read and our write: the other reviewer won.
            throw new AppError(409, 'stale_value', `${row.quantity} revision ${row.revision} was decided by someone else just now.`, [
              { id: row.id, quantity: row.quantity, targetId: row.target_id, seenVersion: seen.get(row.id)!, message: 'decided by someone else just now', current: null },
            ]);
          }
          const along = !chosen.has(row.id);
          entries.push({
            projectId,
            actorUserId: reviewerUserId,
            action: decision === 'approved' ? 'value.approved' : 'value.rejected',
            entityType: 'derived_value',
            entityId: row.id,
            targetId: row.target_id,
            before: summary(row),
            after: { ...summary(row), status: decision, ...(along ? { approvedWith: 'a value computed from it' } : {}) },
            note: body.note,
          });
          if (decision === 'approved') {
            for (const old of await supersedeApprovedBefore(trx, row.target_id, row.quantity, row.revision)) {
              superseded.push(old);
              entries.push({
                projectId,
                actorUserId: reviewerUserId,
                action: 'value.superseded',
                entityType: 'derived_value',
                entityId: old,
                targetId: row.target_id,
                before: { quantity: row.quantity, status: 'approved' },
                after: { quantity: row.quantity, status: 'superseded', by: `revision ${row.revision}` },
              });
            }
          }
        }
        await appendTrailMany(trx, entries, now);
        const decided = await findDerivedInProject(trx, projectId, [...toDecide.keys()]);
        await notifyProposers(trx, projectId, reviewerUserId, decision, body.note, decided, now);
        return { decided: decided.map((r: NamedDerivedRow) => toDerivedValue(r)), superseded };
      });
    },

    /**
     * The project's values as a file, one row per target, produced a batch
     * at a time so the route can stream it. Readers get approved values
     * whatever they ask for (PRODUCT.md, roles); the others may add the
     * newest proposed revision of each quantity.
     */
    async exportValues(projectId: number, userId: number, role: ProjectRole, query: ExportValuesQuery): Promise<Download> {
      const project = await getProjectForUser(db, projectId, userId);
      if (!project) throw notFound('No such project.');
      const include = roleCan(role, 'readProposed') ? query.include : 'approved';
      const batches = eachExportBatch(db, projectId, include === 'approved' ? ['approved'] : ['approved', 'proposed']);
      return query.format === 'csv'
        ? { filename: `${project.code}-values.csv`, contentType: 'text/csv; charset=utf-8', chunks: csvChunks(batches) }
        : {
            filename: `${project.code}-values.vot.xml`,
            contentType: 'application/x-votable+xml; charset=utf-8',
            chunks: votableChunks(batches, { projectCode: project.code, projectName: project.name, include, exportedAt: clock.now() }),
          };
    },

    /** Re-runs the derivations of one target or the whole project in one transaction; proposes only what changed. */
    async rederive(projectId: number, actorUserId: number, targetId?: number): Promise<RederiveResult> {
      if (targetId !== undefined) await requireTarget(projectId, targetId);
      return db.transaction(async (trx) => {
        const now = clock.now();
        const targetIds = targetId !== undefined ? [targetId] : await projectTargetIds(trx, projectId);
        const { proposed } = await rederiveTargets(trx, projectId, targetIds, actorUserId, now);
        await appendTrail(
          trx,
          {
            projectId,
            actorUserId,
            action: 'derivations.rerun',
            entityType: targetId !== undefined ? 'target' : 'project',
            entityId: targetId ?? projectId,
            targetId: targetId ?? null,
            after: { targets: targetIds.length, proposed },
          },
          now,
        );
        return { targets: targetIds.length, proposed };
      });
    },

    /**
     * Every target with a temperature and a luminosity, for the HR diagram.
     * Readers get approved values only (PRODUCT.md, roles), whatever they
     * ask; others may ask for each quantity's newest proposal, which is the
     * newest revision among approved and proposed ones.
     */
    async hr(projectId: number, include: HrQuery['include'], role: ProjectRole): Promise<HrDiagram> {
      const effective = roleCan(role, 'readProposed') ? include : 'approved';
      const rows = await hrRevisions(db, projectId, effective === 'approved' ? ['approved'] : ['approved', 'proposed']);
      const stars: HrStar[] = [];
      let i = 0;
      while (i < rows.length) {
        const targetId = rows[i].targetId;
        const newest = new Map<string, HrRow>();
        let j = i;
        for (; j < rows.length && rows[j].targetId === targetId; j++) newest.set(rows[j].quantity, rows[j]);
        const t = newest.get('temperature');
        const l = newest.get('luminosity');
        if (t && l) {
          stars.push({
            id: targetId,
            designation: rows[i].designation,
            tags: rows[i].tags,
            temperature: { value: t.value, sigma: t.uncertainty, status: t.status },
            luminosity: { value: l.value, sigma: l.uncertainty, status: l.status },
            luminosityClass: newest.get('luminosity_class')?.label ?? null,
          });
        }
        i = j;
      }
      return { include: effective, stars };
    },
  };
}

export type DerivedValuesService = ReturnType<typeof createDerivedValuesService>;
