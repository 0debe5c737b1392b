import type { Db } from '../../db/knex';
import type { Knex } from 'knex';
import type { TrailEntry as TrailRecord } from '../../../shared/schemas/trail';
import { bulkInsert } from '../../db/bulk-insert';
import { parseJson, toIso } from '../../lib/rows';

export interface TrailEntry {
  projectId: number | null;
  actorUserId: number | null;
  action: string;
  entityType: string;
  entityId: number | null;
  /** The target the entry concerns, so the trail can be filtered by target. */
  targetId?: number | null;
  before?: unknown;
  after?: unknown;
  note?: string;
}

function toColumns(entry: TrailEntry, at: Date) {
  return {
    project_id: entry.projectId,
    actor_user_id: entry.actorUserId,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: entry.entityId,
    target_id: entry.targetId ?? null,
    before_json: entry.before === undefined ? null : JSON.stringify(entry.before),
    after_json: entry.after === undefined ? null : JSON.stringify(entry.after),
    note: entry.note ?? '',
    created_at: at.toISOString(),
  };
}

/** Appends one entry to the review trail, inside the caller's transaction so the record and the change land together. */
export async function appendTrail(trx: Db, entry: TrailEntry, at: Date): Promise<void> {
  await trx('trail_events').insert(toColumns(entry, at));
}

/** Appends many entries at once (an upload that creates thousands of targets), in the caller's transaction. */
export async function appendTrailMany(trx: Db, entries: TrailEntry[], at: Date): Promise<void> {
  await bulkInsert(
    trx,
    'trail_events',
    entries.map((e) => toColumns(e, at)),
  );
}

export interface TrailFilters {
  actorId?: number;
  action?: string;
  targetId?: number;
  /** UTC dates (YYYY-MM-DD), both inclusive. */
  from?: string;
  to?: string;
}

interface TrailRow {
  id: number;
  project_id: number | null;
  actor_user_id: number | null;
  actor_name: string | null;
  action: string;
  entity_type: string;
  entity_id: number | null;
  target_id: number | null;
  target_designation: string | null;
  before_json: string | null;
  after_json: string | null;
  note: string;
  created_at: unknown;
  project_code?: string | null;
}

/** A designation written into an entry's before or after, for a target that no longer exists. */
function designationIn(value: unknown): string | null {
  if (value && typeof value === 'object' && 'designation' in value) {
    const d = (value as { designation: unknown }).designation;
    if (typeof d === 'string' && d !== '') return d;
  }
  return null;
}

function toEntry(row: TrailRow): TrailRecord {
  const before = parseJson<unknown>(row.before_json, null);
  const after = parseJson<unknown>(row.after_json, null);
  return {
    id: row.id,
    projectId: row.project_id,
    actor: row.actor_user_id === null ? null : { id: row.actor_user_id, name: row.actor_name ?? `Account ${row.actor_user_id}` },
    action: row.action,
    entityType: row.entity_type,
    entityId: row.entity_id,
    targetId: row.target_id,
    targetDesignation: row.target_designation ?? (row.target_id === null ? null : (designationIn(after) ?? designationIn(before))),
    before,
    after,
    note: row.note,
    createdAt: toIso(row.created_at),
  };
}

function selectEntries(db: Db) {
  return db('trail_events as e')
    .leftJoin('users as u', 'u.id', 'e.actor_user_id')
    // Same project as the entry, so no entry can ever name another project's target.
    .leftJoin('targets as t', function sameProject() {
      this.on('t.id', '=', 'e.target_id').andOn('t.project_id', '=', 'e.project_id');
    })
    .select('e.*', 'u.name as actor_name', 't.designation as target_designation');
}

/** The day after a YYYY-MM-DD date, as the UTC midnight that ends it. */
function endOfDay(date: string): string {
  const d = new Date(`${date}T00:00:00.000Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d.toISOString();
}

function applyFilters(query: Knex.QueryBuilder, projectId: number, f: TrailFilters): Knex.QueryBuilder {
  query.where('e.project_id', projectId);
  if (f.actorId !== undefined) query.andWhere('e.actor_user_id', f.actorId);
  if (f.action !== undefined && f.action !== '') query.andWhere('e.action', f.action);
  if (f.targetId !== undefined) query.andWhere('e.target_id', f.targetId);
  // Timestamps are stored as ISO strings in UTC, so the inclusive day range is a half-open string range.
  if (f.from) query.andWhere('e.created_at', '>=', `${f.from}T00:00:00.000Z`);
  if (f.to) query.andWhere('e.created_at', '<', endOfDay(f.to));
  return query;
}

/**
 * An entry whose target was deleted and which does not carry the designation
 * itself (a value approved before the deletion, say) takes it from the
 * target's deletion entry, which keeps the target as it was.
 */
async function fillDeletedDesignations(db: Db, projectId: number, entries: TrailRecord[]): Promise<TrailRecord[]> {
  const missing = [...new Set(entries.filter((e) => e.targetId !== null && e.targetDesignation === null).map((e) => e.targetId!))];
  if (missing.length === 0) return entries;
  const rows = await db('trail_events')
    .where({ project_id: projectId, entity_type: 'target' })
    .whereIn('entity_id', missing)
    .select('entity_id', 'before_json', 'after_json')
    .orderBy('id', 'desc');
  const found = new Map<number, string>();
  for (const r of rows) {
    if (found.has(r.entity_id)) continue;
    const d = designationIn(parseJson(r.before_json, null)) ?? designationIn(parseJson(r.after_json, null));
    if (d) found.set(r.entity_id, d);
  }
  return entries.map((e) => (e.targetDesignation === null && e.targetId !== null ? { ...e, targetDesignation: found.get(e.targetId) ?? null } : e));
}

/** One page of a project's trail, newest first, with the number of entries the filters match. */
export async function listTrail(
  db: Db,
  projectId: number,
  filters: TrailFilters,
  page: { page: number; pageSize: number },
): Promise<{ items: TrailRecord[]; total: number }> {
  const countRow = await applyFilters(db('trail_events as e'), projectId, filters).count<{ n: number | string }>('* as n').first();
  const rows: TrailRow[] = await applyFilters(selectEntries(db), projectId, filters)
    .orderBy('e.created_at', 'desc')
    .orderBy('e.id', 'desc')
    .limit(page.pageSize)
    .offset((page.page - 1) * page.pageSize);
  return { items: await fillDeletedDesignations(db, projectId, rows.map(toEntry)), total: Number(countRow?.n ?? 0) };
}

/**
 * The whole filtered trail, newest first, a batch at a time, so an export
 * never holds a long trail in memory at once. Batches continue after the
 * last entry seen (keyset), so entries appended meanwhile cannot shift them.
 */
export async function* eachTrailBatch(db: Db, projectId: number, filters: TrailFilters, batchSize = 1000): AsyncGenerator<TrailRecord[]> {
  let last: { createdAt: string; id: number } | null = null;
  for (;;) {
    const query = applyFilters(selectEntries(db), projectId, filters);
    if (last) {
      const { createdAt, id } = last;
      query.andWhere((w) => w.where('e.created_at', '<', createdAt).orWhere((x) => x.where('e.created_at', '=', createdAt).andWhere('e.id', '<', id)));
    }
    const rows: TrailRow[] = await query.orderBy('e.created_at', 'desc').orderBy('e.id', 'desc').limit(batchSize);
    if (rows.length === 0) return;
    yield await fillDeletedDesignations(db, projectId, rows.map(toEntry));
    if (rows.length < batchSize) return;
    const tail = rows[rows.length - 1];
    last = { createdAt: toIso(tail.created_at), id: tail.id };
  }
}

/** The newest entries of the projects in which the person holds one of `roles`. */
export async function listActivity(db: Db, userId: number, roles: readonly string[], limit: number): Promise<(TrailRecord & { projectCode: string | null })[]> {
  const rows: TrailRow[] = await selectEntries(db)
    .join('project_members as m', function mine() {
      this.on('m.project_id', '=', 'e.project_id').andOn('m.user_id', '=', db.raw('?', [userId]));
    })
    .join('projects as p', 'p.id', 'e.project_id')
    .whereIn('m.role', roles as string[])
    .select('p.code as project_code')
    .orderBy('e.created_at', 'desc')
    .orderBy('e.id', 'desc')
    .limit(limit);
  return rows.map((r) => ({ ...toEntry(r), projectCode: r.project_code ?? null }));
}

/**
 * Every entry a person made, or that is about their account (made by a site
 * admin, say), in every project and none, oldest first, with the project's
 * code: their part of the trail for the export of their own data.
 */
export async function listEntriesOfPerson(db: Db, userId: number): Promise<(TrailRecord & { projectCode: string | null })[]> {
  const rows: TrailRow[] = await selectEntries(db)
    .leftJoin('projects as p', 'p.id', 'e.project_id')
    .where('e.actor_user_id', userId)
    .orWhere((w) => w.where('e.entity_type', 'user').andWhere('e.entity_id', userId))
    .select('p.code as project_code')
    .orderBy('e.created_at', 'asc')
    .orderBy('e.id', 'asc');
  return rows.map((r) => ({ ...toEntry(r), projectCode: r.project_code ?? null }));
}
