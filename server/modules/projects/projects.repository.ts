import type { Db } from '../../db/knex';
import type { Project, Site } from '../../../shared/schemas/projects';
import { roleCan, type ProjectRole } from '../../../shared/schemas/roles';
import { toIso } from '../../lib/rows';

interface ProjectRow {
  id: number;
  code: string;
  name: string;
  description: string;
  site_name: string;
  site_latitude_deg: number;
  site_longitude_deg: number;
  site_elevation_m: number;
  site_time_zone: string;
  r_v: number;
  created_at: unknown;
  target_count?: number | string;
  awaiting_review?: number | string;
  my_role?: ProjectRole | null;
}

function toProject(row: ProjectRow): Project {
  return {
    id: row.id,
    code: row.code,
    name: row.name,
    description: row.description,
    site: {
      name: row.site_name,
      latitudeDeg: row.site_latitude_deg,
      longitudeDeg: row.site_longitude_deg,
      elevationM: row.site_elevation_m,
      timeZone: row.site_time_zone,
    },
    rV: row.r_v,
    myRole: row.my_role ?? null,
    targetCount: Number(row.target_count ?? 0),
    // The count is the queue's size, so only roles that read the queue are told it.
    awaitingReview: roleCan(row.my_role, 'readQueue') ? Number(row.awaiting_review ?? 0) : null,
    createdAt: toIso(row.created_at),
  };
}

export function siteColumns(site: Partial<Site>) {
  const cols: Record<string, unknown> = {};
  if (site.name !== undefined) cols.site_name = site.name;
  if (site.latitudeDeg !== undefined) cols.site_latitude_deg = site.latitudeDeg;
  if (site.longitudeDeg !== undefined) cols.site_longitude_deg = site.longitudeDeg;
  if (site.elevationM !== undefined) cols.site_elevation_m = site.elevationM;
  if (site.timeZone !== undefined) cols.site_time_zone = site.timeZone;
  return cols;
}

function projectsWithRole(db: Db, userId: number) {
  return db('projects as p')
    .leftJoin('project_members as m', function joinMine() {
      this.on('m.project_id', '=', 'p.id').andOn('m.user_id', '=', db.raw('?', [userId]));
    })
    .select(
      'p.*',
      'm.role as my_role',
      db('targets as t').count('*').whereRaw('t.project_id = p.id').as('target_count'),
      db('derived_values as d').count('*').whereRaw('d.project_id = p.id').andWhere('d.status', 'proposed').as('awaiting_review'),
    );
}

export async function listProjectsForMember(db: Db, userId: number): Promise<Project[]> {
  const rows = await projectsWithRole(db, userId).whereNotNull('m.role').orderBy('p.name');
  return rows.map(toProject);
}

export async function getProjectForUser(db: Db, projectId: number, userId: number): Promise<Project | undefined> {
  const row = await projectsWithRole(db, userId).where('p.id', projectId).first();
  return row ? toProject(row) : undefined;
}

export async function roleInProject(db: Db, projectId: number, userId: number): Promise<ProjectRole | undefined> {
  const row = await db('project_members').where({ project_id: projectId, user_id: userId }).first('role');
  return row?.role;
}

export async function findProjectByCode(db: Db, code: string): Promise<{ id: number } | undefined> {
  return db('projects').where({ code }).first('id');
}

export async function insertProject(
  db: Db,
  input: { code: string; name: string; description: string; site: Site; rV: number },
  at: Date,
): Promise<number> {
  const [row] = await db('projects')
    .insert({
      code: input.code,
      name: input.name,
      description: input.description,
      ...siteColumns(input.site),
      r_v: input.rV,
      created_at: at.toISOString(),
      updated_at: at.toISOString(),
    })
    .returning('id');
  return typeof row === 'object' ? row.id : row;
}

export async function updateProjectRow(db: Db, projectId: number, cols: Record<string, unknown>, at: Date): Promise<void> {
  await db('projects').where({ id: projectId }).update({ ...cols, updated_at: at.toISOString() });
}
