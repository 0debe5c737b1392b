import type { Knex } from 'knex';
import type { Db } from '../../db/knex';
import type { DerivedStatus, DerivedValue, InputProvenance, ReviewQueueQuery } from '../../../shared/schemas/derived';
import { QUANTITY_IDS } from '../../../shared/physics/quantities';
import { chunks } from '../../lib/chunks';
import { bulkInsert } from '../../db/bulk-insert';
import { parseJson, toIso } from '../../lib/rows';

export interface DerivedRow {
  id: number;
  project_id: number;
  target_id: number;
  quantity: string;
  value: number;
  uncertainty: number;
  /** The 68 % interval's ends (SI) where it is asymmetric; both null otherwise. */
  interval_low: number | null;
  interval_high: number | null;
  unit: string;
  label: string | null;
  method: string;
  method_label: string;
  inputs_json: string;
  constants_json: string;
  warnings_json: string;
  depends_on_json: string;
  revision: number;
  version: number;
  status: DerivedStatus;
  proposed_by_user_id: number | null;
  reviewer_user_id: number | null;
  review_note: string;
  reviewed_at: unknown;
  created_at: unknown;
}

/** A derived row with the names of who proposed and who reviewed it. */
export interface NamedDerivedRow extends DerivedRow {
  proposed_by_name: string | null;
  reviewer_name: string | null;
}

/** The stored interval, or null where the value's interval is symmetric. */
export function intervalOf(r: Pick<DerivedRow, 'interval_low' | 'interval_high'>): { low: number; high: number } | null {
  return r.interval_low != null && r.interval_high != null ? { low: r.interval_low, high: r.interval_high } : null;
}

export function toDerivedValue(r: NamedDerivedRow): DerivedValue {
  return {
    id: r.id,
    targetId: r.target_id,
    quantity: r.quantity,
    value: r.value,
    uncertainty: r.uncertainty,
    interval: intervalOf(r),
    unit: r.unit,
    label: r.label,
    method: r.method,
    methodLabel: r.method_label,
    inputs: parseJson(r.inputs_json, []),
    constants: parseJson(r.constants_json, []),
    warnings: parseJson(r.warnings_json, []),
    dependsOn: parseJson(r.depends_on_json, []),
    revision: r.revision,
    version: r.version,
    status: r.status,
    proposedBy: r.proposed_by_name ?? null,
    reviewer: r.reviewer_name ?? null,
    reviewNote: r.review_note,
    reviewedAt: r.reviewed_at == null ? null : toIso(r.reviewed_at),
    createdAt: toIso(r.created_at),
  };
}

function named(db: Db) {
  return db('derived_values as d')
    .leftJoin('users as pu', 'pu.id', 'd.proposed_by_user_id')
    .leftJoin('users as ru', 'ru.id', 'd.reviewer_user_id')
    .select('d.*', 'pu.name as proposed_by_name', 'ru.name as reviewer_name');
}

type Revision = Pick<DerivedRow, 'target_id' | 'quantity' | 'revision'>;

/**
 * Adds to `newest` each row that is the newest revision of its target's
 * quantity so far, keyed `targetId:quantity`: one pass, in any row order
 * (an ORDER BY revision made SQLite sort the rows first).
 */
export function keepNewestRevisions<R extends Revision>(rows: readonly R[], newest = new Map<string, R>()): Map<string, R> {
  for (const r of rows) {
    const key = `${r.target_id}:${r.quantity}`;
    if ((newest.get(key)?.revision ?? -Infinity) < r.revision) newest.set(key, r);
  }
  return newest;
}

/** The newest revision of every quantity of the given targets, keyed `targetId:quantity`. */
export async function latestRevisions(db: Db, targetIds: number[]): Promise<Map<string, DerivedRow>> {
  const latest = new Map<string, DerivedRow>();
  for (const ids of chunks(targetIds, 500)) keepNewestRevisions<DerivedRow>(await db('derived_values').whereIn('target_id', ids), latest);
  return latest;
}

/** The newest approved revision of every quantity of the given targets, keyed `targetId:quantity`. */
export async function approvedRevisions(db: Db, targetIds: number[]): Promise<Map<string, NamedDerivedRow>> {
  const approved = new Map<string, NamedDerivedRow>();
  for (const ids of chunks(targetIds, 500)) keepNewestRevisions<NamedDerivedRow>(await named(db).whereIn('d.target_id', ids).where('d.status', 'approved'), approved);
  return approved;
}

export type NewDerivedRow = Omit<DerivedRow, 'id' | 'reviewed_at' | 'review_note' | 'reviewer_user_id' | 'version'>;

export async function insertDerivedRows(db: Db, rows: NewDerivedRow[]): Promise<void> {
  await bulkInsert(db, 'derived_values', rows);
}

/** Ids of the rows just inserted for these (target, quantity, revision) keys. */
export async function idsOfRevisions(db: Db, keys: { target_id: number; quantity: string; revision: number }[]): Promise<Map<string, number>> {
  const ids = new Map<string, number>();
  const targetIds = [...new Set(keys.map((k) => k.target_id))];
  const wanted = new Set(keys.map((k) => `${k.target_id}:${k.quantity}:${k.revision}`));
  for (const batch of chunks(targetIds, 500)) {
    const rows: { id: number; target_id: number; quantity: string; revision: number }[] = await db('derived_values')
      .whereIn('target_id', batch)
      .where('status', 'proposed')
      .select('id', 'target_id', 'quantity', 'revision');
    for (const r of rows) {
      const key = `${r.target_id}:${r.quantity}:${r.revision}`;
      if (wanted.has(key)) ids.set(key, r.id);
    }
  }
  return ids;
}

/** An unreviewed proposal replaced by a newer one. */
export async function supersedeProposals(db: Db, ids: number[]): Promise<void> {
  for (const batch of chunks(ids, 500)) {
    await db('derived_values').whereIn('id', batch).where('status', 'proposed').update({ status: 'superseded', version: db.raw('version + 1') });
  }
}

export async function findDerivedInProject(db: Db, projectId: number, ids: number[]): Promise<NamedDerivedRow[]> {
  const rows: NamedDerivedRow[] = [];
  for (const batch of chunks(ids, 500)) rows.push(...(await named(db).where('d.project_id', projectId).whereIn('d.id', batch)));
  return rows;
}

/**
 * Moves one proposed revision to `approved` or `rejected`, only if it is
 * still proposed at the version the reviewer saw. Returns false when another
 * decision or a newer proposal got there first: the compare-and-set that
 * makes one of two simultaneous reviewers win.
 */
export async function decide(
  db: Db,
  id: number,
  seenVersion: number,
  decision: { status: 'approved' | 'rejected'; reviewerUserId: number; note: string; at: Date },
): Promise<boolean> {
  const changed = await db('derived_values')
    .where({ id, version: seenVersion, status: 'proposed' })
    .update({
      status: decision.status,
      reviewer_user_id: decision.reviewerUserId,
      review_note: decision.note,
      reviewed_at: decision.at.toISOString(),
      version: seenVersion + 1,
    });
  return changed === 1;
}

/** Approved revisions older than `revision` of one quantity: superseded once their successor is approved. */
export async function supersedeApprovedBefore(db: Db, targetId: number, quantity: string, revision: number): Promise<number[]> {
  const rows: { id: number }[] = await db('derived_values')
    .where({ target_id: targetId, quantity, status: 'approved' })
    .where('revision', '<', revision)
    .select('id');
  const ids = rows.map((r) => r.id);
  if (ids.length > 0) await db('derived_values').whereIn('id', ids).update({ status: 'superseded', version: db.raw('version + 1') });
  return ids;
}

export async function listDerived(db: Db, projectId: number, targetId: number, include: 'current' | 'all'): Promise<DerivedValue[]> {
  const q = named(db).where({ 'd.project_id': projectId, 'd.target_id': targetId });
  if (include === 'current') q.whereNot('d.status', 'superseded');
  const rows: NamedDerivedRow[] = await q.orderBy([{ column: 'd.quantity' }, { column: 'd.revision', order: 'desc' }]);
  return rows.map(toDerivedValue);
}

/** Order of the derivation table (PRODUCT.md), portable SQL. */
function quantityOrder(db: Db): Knex.Raw {
  const cases = QUANTITY_IDS.map((_, i) => `when ? then ${i}`).join(' ');
  return db.raw(`case d.quantity ${cases} else ${QUANTITY_IDS.length} end`, [...QUANTITY_IDS]);
}

export interface QueueRow extends NamedDerivedRow {
  designation: string;
}

/** One page of proposed values, by target designation then derivation-table order. */
/**
 * Past this many proposals a queue page is read in designation order from
 * the targets' index, stopping once the page is full; below it, the few
 * proposals are sorted. Sorting 10 000 proposals for each 25-row page took
 * 160 ms at 100 000 targets, while walking the index of a project with a
 * handful of proposals would visit every target to find them.
 */
const WALK_TARGETS_FROM = 1_000;

export async function proposedPage(db: Db, projectId: number, query: ReviewQueueQuery): Promise<{ rows: QueueRow[]; total: number }> {
  const filters = (q: Knex.QueryBuilder) => {
    q.where({ 'd.project_id': projectId, 'd.status': 'proposed' });
    if (query.targetId) q.where('d.target_id', query.targetId);
    if (query.quantity) q.where('d.quantity', query.quantity);
    if (query.warnings === 'with') q.whereNot('d.warnings_json', '[]');
    if (query.warnings === 'without') q.where('d.warnings_json', '[]');
    return q;
  };
  // A derived value's target is always in the value's project, so the count needs no join.
  const [{ n }] = await filters(db('derived_values as d')).count<{ n: number | string }[]>({ n: '*' });
  const total = Number(n);
  // CROSS JOIN makes SQLite keep the written order (targets outside); PostgreSQL plans it as the inner join it is.
  const page =
    total >= WALK_TARGETS_FROM
      ? db('targets as t').joinRaw('CROSS JOIN derived_values AS d').whereRaw('d.target_id = t.id').andWhere('t.project_id', projectId)
      : db('derived_values as d').join('targets as t', 't.id', 'd.target_id');
  const rows: QueueRow[] = await filters(page)
    .leftJoin('users as pu', 'pu.id', 'd.proposed_by_user_id')
    .leftJoin('users as ru', 'ru.id', 'd.reviewer_user_id')
    .select('d.*', 'pu.name as proposed_by_name', 'ru.name as reviewer_name', 't.designation')
    .orderBy('t.designation_key')
    .orderBy('t.id')
    .orderByRaw(quantityOrder(db))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return { rows, total };
}

/** Where each measurement came from: its upload (file name) and row. */
export async function provenanceOf(db: Db, measurementIds: number[]): Promise<Map<number, InputProvenance>> {
  const out = new Map<number, InputProvenance>();
  for (const batch of chunks(measurementIds, 500)) {
    const rows = await db('measurements as m')
      .leftJoin('uploads as u', 'u.id', 'm.upload_id')
      .whereIn('m.id', batch)
      .select('m.id', 'm.kind', 'm.band', 'm.upload_id', 'm.row_number', 'u.filename');
    for (const r of rows) {
      out.set(r.id, { measurementId: r.id, kind: r.kind, band: r.band ?? null, uploadId: r.upload_id ?? null, uploadFilename: r.filename ?? null, rowNumber: r.row_number ?? null });
    }
  }
  return out;
}

/** Project-wide settings the engine reads: R_V, and each target's assumed luminosity class. */
export async function derivationSettings(db: Db, projectId: number, targetIds: number[]): Promise<{ rV: number; assumedClass: Map<number, string> }> {
  const project = await db('projects').where({ id: projectId }).first('r_v');
  const assumedClass = new Map<number, string>();
  for (const batch of chunks(targetIds, 500)) {
    const rows: { id: number; assumed_class: string }[] = await db('targets').whereIn('id', batch).select('id', 'assumed_class');
    for (const r of rows) assumedClass.set(r.id, r.assumed_class);
  }
  return { rV: Number(project?.r_v ?? 3.1), assumedClass };
}

export async function projectTargetIds(db: Db, projectId: number): Promise<number[]> {
  const rows: { id: number }[] = await db('targets').where({ project_id: projectId }).orderBy('id').select('id');
  return rows.map((r) => r.id);
}

export async function countProposed(db: Db, projectId: number): Promise<number> {
  const [{ n }] = await db('derived_values').where({ project_id: projectId, status: 'proposed' }).count<{ n: number | string }[]>({ n: '*' });
  return Number(n);
}

/** The quantities the HR diagram reads. */
const HR_QUANTITIES = ['temperature', 'luminosity', 'luminosity_class'] as const;

export interface HrRow {
  targetId: number;
  designation: string;
  tags: string[];
  quantity: (typeof HR_QUANTITIES)[number];
  value: number;
  uncertainty: number;
  label: string | null;
  status: DerivedStatus;
}

/**
 * The HR diagram's values for a whole project in one query: the revisions of
 * temperature, luminosity and luminosity class with one of the given
 * statuses, by target then revision, so the caller keeps the last of each.
 * Only the few columns the diagram draws are read (inputs and constants
 * would be most of the bytes for 10 000 stars).
 */
export async function hrRevisions(db: Db, projectId: number, statuses: readonly DerivedStatus[]): Promise<HrRow[]> {
  const rows: { target_id: number; designation: string; tags: string; quantity: HrRow['quantity']; value: number; uncertainty: number; label: string | null; status: DerivedStatus }[] =
    await db('derived_values as d')
      .join('targets as t', 't.id', 'd.target_id')
      .where('d.project_id', projectId)
      .whereIn('d.status', [...statuses])
      .whereIn('d.quantity', [...HR_QUANTITIES])
      .orderBy('t.designation_key')
      .orderBy('d.target_id')
      .orderBy('d.revision')
      .select('d.target_id', 't.designation', 't.tags', 'd.quantity', 'd.value', 'd.uncertainty', 'd.label', 'd.status');
  return rows.map((r) => ({
    targetId: r.target_id,
    designation: r.designation,
    tags: parseJson<string[]>(r.tags, []),
    quantity: r.quantity,
    value: r.value,
    uncertainty: r.uncertainty,
    label: r.label,
    status: r.status,
  }));
}

/** One target of a values export: where it is, and the chosen revision of each quantity it has. */
export interface ExportTarget {
  id: number;
  designation: string;
  raDeg: number;
  decDeg: number;
  values: Map<string, Pick<DerivedRow, 'value' | 'uncertainty' | 'unit' | 'label' | 'status' | 'revision'>>;
}

/**
 * The project's targets in designation order, a batch at a time (keyset
 * paging, so 10 000 targets never sit in memory at once), each with the
 * newest revision of every quantity whose status is one of `statuses`.
 */
export async function* eachExportBatch(db: Db, projectId: number, statuses: readonly DerivedStatus[], batchSize = 500): AsyncGenerator<ExportTarget[]> {
  let after: { key: string; id: number } | null = null;
  for (;;) {
    const q = db('targets').where({ project_id: projectId });
    if (after) {
      const { key, id } = after;
      q.andWhere((w) => w.where('designation_key', '>', key).orWhere((x) => x.where('designation_key', '=', key).andWhere('id', '>', id)));
    }
    const targets: { id: number; designation: string; designation_key: string; ra_deg: number; dec_deg: number }[] = await q
      .orderBy('designation_key')
      .orderBy('id')
      .limit(batchSize)
      .select('id', 'designation', 'designation_key', 'ra_deg', 'dec_deg');
    if (targets.length === 0) return;
    const byId = new Map<number, ExportTarget>(targets.map((t) => [t.id, { id: t.id, designation: t.designation, raDeg: t.ra_deg, decDeg: t.dec_deg, values: new Map() }]));
    const rows: Pick<DerivedRow, 'target_id' | 'quantity' | 'value' | 'uncertainty' | 'unit' | 'label' | 'status' | 'revision'>[] = await db('derived_values')
      .where({ project_id: projectId })
      .whereIn('target_id', [...byId.keys()])
      .whereIn('status', statuses as DerivedStatus[])
      .orderBy('revision', 'asc')
      .select('target_id', 'quantity', 'value', 'uncertainty', 'unit', 'label', 'status', 'revision');
    // Ascending revisions: the newest of each quantity is written last and stays.
    for (const r of rows) byId.get(r.target_id)!.values.set(r.quantity, { value: r.value, uncertainty: r.uncertainty, unit: r.unit, label: r.label, status: r.status, revision: r.revision });
    yield [...byId.values()];
    if (targets.length < batchSize) return;
    const tail = targets[targets.length - 1];
    after = { key: tail.designation_key, id: tail.id };
  }
}
