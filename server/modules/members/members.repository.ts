import type { Db } from '../../db/knex';
import type { Member } from '../../../shared/schemas/projects';
import type { ProjectRole } from '../../../shared/schemas/roles';
import { toIso } from '../../lib/rows';

export async function insertMember(db: Db, m: { projectId: number; userId: number; role: ProjectRole }, at: Date): Promise<void> {
  await db('project_members').insert({ project_id: m.projectId, user_id: m.userId, role: m.role, added_at: at.toISOString() });
}

export async function listMembers(db: Db, projectId: number): Promise<Member[]> {
  const rows = await db('project_members as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.project_id', projectId)
    .orderBy('u.name')
    .select('u.id as user_id', 'u.email', 'u.name', 'm.role', 'm.added_at');
  return rows.map((r: { user_id: number; email: string; name: string; role: ProjectRole; added_at: unknown }) => ({
    userId: r.user_id,
    email: r.email,
    name: r.name,
    role: r.role,
    addedAt: toIso(r.added_at),
  }));
}

export async function getMember(db: Db, projectId: number, userId: number): Promise<Member | undefined> {
  return (await listMembers(db, projectId)).find((m) => m.userId === userId);
}

export async function setMemberRole(db: Db, projectId: number, userId: number, role: ProjectRole): Promise<void> {
  await db('project_members').where({ project_id: projectId, user_id: userId }).update({ role });
}

export async function deleteMember(db: Db, projectId: number, userId: number): Promise<void> {
  await db('project_members').where({ project_id: projectId, user_id: userId }).delete();
}

export async function countLeads(db: Db, projectId: number): Promise<number> {
  const row = await db('project_members').where({ project_id: projectId, role: 'lead' }).count<{ n: number | string }>('* as n').first();
  return Number(row?.n ?? 0);
}
