import type { Db } from '../../db/knex';
import type { Knex } from 'knex';
import type { LuminosityClassName } from '../../../shared/physics/main-sequence';
import type { DerivedStatus } from '../../../shared/schemas/derived';
import { tableQuantities, tableQuantitySources, type ListTargetsQuery, type TableQuantity, type TableValue, type Target, type TargetRow } from '../../../shared/schemas/targets';
import type { Page } from '../../../shared/schemas/common';
import { parseJson, toIso } from '../../lib/rows';
import { bulkInsert } from '../../db/bulk-insert';
import { chunks } from '../../lib/chunks';
import { intervalOf, keepNewestRevisions, type DerivedRow } from '../derived-values/derived-values.repository';

export interface TargetRecord {
  id: number;
  project_id: number;
  designation: string;
  designation_key: string;
  ra_deg: number;
  dec_deg: number;
  notes: string;
  tags: string;
  assumed_class: LuminosityClassName;
  created_at: unknown;
  updated_at: unknown;
}

export function toTarget(row: TargetRecord): Target {
  return {
    id: row.id,
    projectId: row.project_id,
    designation: row.designation,
    raDeg: row.ra_deg,
    decDeg: row.dec_deg,
    notes: row.notes,
    tags: parseJson<string[]>(row.tags, []),
    assumedClass: row.assumed_class,
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

const sortColumns: Record<Exclude<ListTargetsQuery['sort'], TableQuantity>, string> = {
  designation: 't.designation_key',
  raDeg: 't.ra_deg',
  decDeg: 't.dec_deg',
  updatedAt: 't.updated_at',
};

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

const isTableQuantity = (key: string): key is TableQuantity => (tableQuantities as readonly string[]).includes(key);

/** What the caller may see of the derived values: which statuses are shown, and whether proposals are counted. */
export interface ValueView {
  shownStatuses: readonly DerivedStatus[];
  countProposals: boolean;
}

/**
 * The shown revision of one stored quantity, per target of the project: the
 * newest among the shown statuses (no newer revision of those statuses
 * exists). A correlated NOT EXISTS rather than a window function keeps it
 * plain SQL for both SQLite and PostgreSQL.
 */
function shownRevisions(db: Db, projectId: number, quantity: string, statuses: readonly DerivedStatus[]) {
  return db('derived_values as dv')
    .select('dv.target_id', 'dv.value')
    .where('dv.project_id', projectId)
    .andWhere('dv.quantity', quantity)
    .whereIn('dv.status', [...statuses])
    .whereNotExists(function newer(this: Knex.QueryBuilder) {
      this.select(db.raw('1'))
        .from('derived_values as nv')
        .whereRaw('nv.target_id = dv.target_id')
        .andWhereRaw('nv.quantity = dv.quantity')
        .whereIn('nv.status', [...statuses])
        .andWhereRaw('nv.revision > dv.revision');
    });
}

type ShownRow = Pick<DerivedRow, 'target_id' | 'quantity' | 'revision' | 'value' | 'uncertainty' | 'interval_low' | 'interval_high' | 'unit' | 'label' | 'status'>;

/** The table's values of the given targets, each column from the first of its sources that has a shown revision. */
async function tableValuesOf(db: Db, targetIds: number[], statuses: readonly DerivedStatus[]): Promise<Map<number, TargetRow['values']>> {
  const stored = [...new Set(Object.values(tableQuantitySources).flat())];
  const rows: ShownRow[] = targetIds.length
    ? await db('derived_values')
        .select('target_id', 'quantity', 'revision', 'value', 'uncertainty', 'interval_low', 'interval_high', 'unit', 'label', 'status')
        .whereIn('target_id', targetIds)
        .whereIn('quantity', stored)
        .whereIn('status', [...statuses])
    : [];
  const newest = keepNewestRevisions(rows);
  const byTarget = new Map<number, TargetRow['values']>();
  for (const id of targetIds) {
    const values: TargetRow['values'] = {};
    for (const column of tableQuantities) {
      const found = tableQuantitySources[column].map((q) => newest.get(`${id}:${q}`)).find(Boolean);
      if (found) {
        values[column] = {
          quantity: found.quantity,
          value: found.value,
          uncertainty: found.uncertainty,
          interval: intervalOf(found),
          unit: found.unit,
          label: found.label,
          status: found.status,
        } satisfies TableValue;
      }
    }
    byTarget.set(id, values);
  }
  return byTarget;
}

/**
 * One page of a project's targets with their adopted values as the caller
 * may see them. A sort by a table quantity joins the shown revision of each
 * of its sources; targets without the value sort last in either direction.
 */
export async function listTargets(db: Db, projectId: number, query: ListTargetsQuery, view: ValueView): Promise<Page<TargetRow>> {
  const base = db('targets as t').where('t.project_id', projectId);
  if (query.q) {
    const like = `%${escapeLike(query.q.replace(/\s+/g, '').toLowerCase())}%`;
    base.andWhere((w) =>
      w.whereRaw("t.designation_key LIKE ? ESCAPE '\\'", [like]).orWhereRaw("LOWER(t.notes) LIKE ? ESCAPE '\\'", [`%${escapeLike(query.q!.toLowerCase())}%`]),
    );
  }
  if (query.tag) {
    // Tags are stored as a JSON array of strings; the quoted form matches one whole tag. Lowered on both sides, as SQLite's LIKE ignores (ASCII) case and PostgreSQL's does not.
    base.andWhereRaw("LOWER(t.tags) LIKE ? ESCAPE '\\'", [`%${escapeLike(JSON.stringify(query.tag.toLowerCase()))}%`]);
  }
  if (query.awaiting) {
    base.whereExists(function proposed(this: Knex.QueryBuilder) {
      this.select(db.raw('1')).from('derived_values as w').whereRaw('w.target_id = t.id').andWhere('w.status', 'proposed');
    });
  }
  // Unfiltered, the total is the project's own count (kept by triggers); a filter counts what it matches.
  const filtered = Boolean(query.q || query.tag || query.awaiting);
  const countRow = filtered
    ? await base.clone().count<{ n: number | string }>('* as n').first()
    : await db('projects').where({ id: projectId }).first<{ n: number | string } | undefined>('target_count as n');

  const page = base.clone().select('t.*');
  if (view.countProposals) {
    page.select(db('derived_values as w').count('*').whereRaw('w.target_id = t.id').andWhere('w.status', 'proposed').as('awaiting_review'));
  }
  if (isTableQuantity(query.sort)) {
    const joined = tableQuantitySources[query.sort].map((quantity, i) => {
      const alias = `shown_${i}`;
      page.leftJoin(shownRevisions(db, projectId, quantity, view.shownStatuses).as(alias), `${alias}.target_id`, 't.id');
      return `${alias}.value`;
    });
    const sortValue = joined.length === 1 ? joined[0] : `COALESCE(${joined.join(', ')})`;
    // `order` is one of asc/desc (validated), so it can be written into the SQL.
    page.orderByRaw(`CASE WHEN ${sortValue} IS NULL THEN 1 ELSE 0 END`).orderByRaw(`${sortValue} ${query.order}`);
  } else {
    page.orderBy(sortColumns[query.sort], query.order);
  }
  const rows: (TargetRecord & { awaiting_review?: number | string })[] = await page
    .orderBy('t.id', 'asc')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);

  const values = await tableValuesOf(
    db,
    rows.map((r) => r.id),
    view.shownStatuses,
  );
  return {
    items: rows.map((r) => ({ ...toTarget(r), values: values.get(r.id) ?? {}, awaitingReview: Number(r.awaiting_review ?? 0) })),
    total: Number(countRow?.n ?? 0),
    page: query.page,
    pageSize: query.pageSize,
  };
}

export async function findTarget(db: Db, projectId: number, targetId: number): Promise<Target | undefined> {
  const row = await db<TargetRecord>('targets').where({ project_id: projectId, id: targetId }).first();
  return row ? toTarget(row) : undefined;
}

export async function findTargetIdByKey(db: Db, projectId: number, key: string): Promise<number | undefined> {
  const row = await db<TargetRecord>('targets').where({ project_id: projectId, designation_key: key }).first('id');
  return row?.id;
}

export async function insertTarget(
  db: Db,
  t: {
    projectId: number;
    designation: string;
    designationKey: string;
    raDeg: number;
    decDeg: number;
    notes: string;
    tags: string[];
    /** Omitted (targets an upload creates): the column's default, main sequence. */
    assumedClass?: LuminosityClassName;
  },
  at: Date,
): Promise<number> {
  const [row] = await db('targets')
    .insert({
      project_id: t.projectId,
      designation: t.designation,
      designation_key: t.designationKey,
      ra_deg: t.raDeg,
      dec_deg: t.decDeg,
      notes: t.notes,
      tags: JSON.stringify(t.tags),
      ...(t.assumedClass ? { assumed_class: t.assumedClass } : {}),
      created_at: at.toISOString(),
      updated_at: at.toISOString(),
    })
    .returning('id');
  return typeof row === 'object' ? row.id : row;
}

export async function updateTargetRow(db: Db, targetId: number, cols: Record<string, unknown>, at: Date): Promise<void> {
  await db('targets').where({ id: targetId }).update({ ...cols, updated_at: at.toISOString() });
}

/** Every target id of a project, for a project-wide re-derivation. */
export async function targetIdsOfProject(db: Db, projectId: number): Promise<number[]> {
  const rows: { id: number }[] = await db('targets').where({ project_id: projectId }).select('id').orderBy('id');
  return rows.map((r) => r.id);
}

export async function deleteTargetRow(db: Db, targetId: number): Promise<void> {
  await db('targets').where({ id: targetId }).delete();
}

/** Many new targets at once (those an upload creates), in the caller's transaction; their ids by designation key. */
export async function insertTargets(
  trx: Db,
  projectId: number,
  targets: { designation: string; designationKey: string; raDeg: number; decDeg: number }[],
  at: Date,
): Promise<Map<string, number>> {
  await bulkInsert(
    trx,
    'targets',
    targets.map((t) => ({
      project_id: projectId,
      designation: t.designation,
      designation_key: t.designationKey,
      ra_deg: t.raDeg,
      dec_deg: t.decDeg,
      notes: '',
      tags: '[]',
      created_at: at.toISOString(),
      updated_at: at.toISOString(),
    })),
  );
  const ids = new Map<string, number>();
  for (const batch of chunks(targets.map((t) => t.designationKey), 500)) {
    const rows = await trx('targets').where({ project_id: projectId }).whereIn('designation_key', batch).select('id', 'designation_key');
    for (const r of rows as { id: number; designation_key: string }[]) ids.set(r.designation_key, r.id);
  }
  return ids;
}
