import type { Db } from '../../db/knex';
import type { ListTargetsQuery, Target } from '../../../shared/schemas/targets';
import type { Page } from '../../../shared/schemas/common';
import { parseJson, toIso } from '../../lib/rows';

export interface TargetRow {
  id: number;
  project_id: number;
  designation: string;
  designation_key: string;
  ra_deg: number;
  dec_deg: number;
  notes: string;
  tags: string;
  created_at: unknown;
  updated_at: unknown;
}

export function toTarget(row: TargetRow): Target {
  return {
    id: row.id,
    projectId: row.project_id,
    designation: row.designation,
    raDeg: row.ra_deg,
    decDeg: row.dec_deg,
    notes: row.notes,
    tags: parseJson<string[]>(row.tags, []),
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

const sortColumns: Record<ListTargetsQuery['sort'], string> = {
  designation: 'designation_key',
  raDeg: 'ra_deg',
  decDeg: 'dec_deg',
  updatedAt: 'updated_at',
};

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function listTargets(db: Db, projectId: number, query: ListTargetsQuery): Promise<Page<Target>> {
  const base = db<TargetRow>('targets').where({ project_id: projectId });
  if (query.q) {
    const like = `%${escapeLike(query.q.replace(/\s+/g, '').toLowerCase())}%`;
    base.andWhere((w) => w.whereRaw("designation_key LIKE ? ESCAPE '\\'", [like]).orWhereRaw("LOWER(notes) LIKE ? ESCAPE '\\'", [`%${escapeLike(query.q!.toLowerCase())}%`]));
  }
  if (query.tag) {
    // Tags are stored as a JSON array of strings; the quoted form matches one whole tag.
    base.andWhereRaw("tags LIKE ? ESCAPE '\\'", [`%${escapeLike(JSON.stringify(query.tag))}%`]);
  }
  const countRow = await base.clone().count<{ n: number | string }>('* as n').first();
  const rows = await base
    .clone()
    .orderBy(sortColumns[query.sort], query.order)
    .orderBy('id', 'asc')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return { items: rows.map(toTarget), total: Number(countRow?.n ?? 0), page: query.page, pageSize: query.pageSize };
}

export async function findTarget(db: Db, projectId: number, targetId: number): Promise<Target | undefined> {
  const row = await db<TargetRow>('targets').where({ project_id: projectId, id: targetId }).first();
  return row ? toTarget(row) : undefined;
}

export async function findTargetIdByKey(db: Db, projectId: number, key: string): Promise<number | undefined> {
  const row = await db<TargetRow>('targets').where({ project_id: projectId, designation_key: key }).first('id');
  return row?.id;
}

export async function insertTarget(
  db: Db,
  t: { projectId: number; designation: string; designationKey: string; raDeg: number; decDeg: number; notes: string; tags: string[] },
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
      created_at: at.toISOString(),
      updated_at: at.toISOString(),
    })
    .returning('id');
  return typeof row === 'object' ? row.id : row;
}

export async function updateTargetRow(db: Db, targetId: number, cols: Record<string, unknown>, at: Date): Promise<void> {
  await db('targets').where({ id: targetId }).update({ ...cols, updated_at: at.toISOString() });
}

export async function deleteTargetRow(db: Db, targetId: number): Promise<void> {
  await db('targets').where({ id: targetId }).delete();
}
