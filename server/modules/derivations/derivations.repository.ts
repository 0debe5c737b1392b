import type { Db } from '../../db/knex';
import type { DerivedStatus, DerivedValue } from '../../../shared/schemas/derived';
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
  unit: string;
  label: string | null;
  method: string;
  method_label: string;
  inputs_json: string;
  constants_json: string;
  warnings_json: string;
  revision: number;
  status: DerivedStatus;
  review_note: string;
  reviewed_at: unknown;
  created_at: unknown;
}

export function toDerivedValue(r: DerivedRow): DerivedValue {
  return {
    id: r.id,
    targetId: r.target_id,
    quantity: r.quantity,
    value: r.value,
    uncertainty: r.uncertainty,
    unit: r.unit,
    label: r.label,
    method: r.method,
    methodLabel: r.method_label,
    inputs: parseJson(r.inputs_json, []),
    constants: parseJson(r.constants_json, []),
    warnings: parseJson(r.warnings_json, []),
    revision: r.revision,
    status: r.status,
    reviewNote: r.review_note,
    reviewedAt: r.reviewed_at == null ? null : toIso(r.reviewed_at),
    createdAt: toIso(r.created_at),
  };
}

/** The newest revision of every quantity of the given targets. */
export async function latestRevisions(db: Db, targetIds: number[]): Promise<Map<string, DerivedRow>> {
  const latest = new Map<string, DerivedRow>();
  for (const ids of chunks(targetIds, 500)) {
    const rows: DerivedRow[] = await db('derived_values').whereIn('target_id', ids).orderBy('revision', 'asc');
    for (const r of rows) latest.set(`${r.target_id}:${r.quantity}`, r);
  }
  return latest;
}

export type NewDerivedRow = Omit<DerivedRow, 'id' | 'reviewed_at' | 'review_note'> & { proposed_by_user_id: number | null };

export async function insertDerivedRows(db: Db, rows: NewDerivedRow[]): Promise<void> {
  await bulkInsert(db, 'derived_values', rows);
}

export async function markSuperseded(db: Db, ids: number[]): Promise<void> {
  for (const batch of chunks(ids, 500)) await db('derived_values').whereIn('id', batch).update({ status: 'superseded' });
}

export async function listDerived(db: Db, projectId: number, targetId: number, include: 'current' | 'all'): Promise<DerivedValue[]> {
  const q = db<DerivedRow>('derived_values').where({ project_id: projectId, target_id: targetId });
  if (include === 'current') q.whereNot('status', 'superseded');
  const rows = await q.orderBy([{ column: 'quantity' }, { column: 'revision', order: 'desc' }]);
  return rows.map(toDerivedValue);
}
