/**
 * What the load and fault scripts share: one person with a known API token
 * in one project of a fresh database, written straight through Knex.
 */
import { createHash } from 'node:crypto';
import type { Db } from '../server/db/knex';
import type { ProjectRole } from '../shared/schemas/roles';

export async function seedMemberWithToken(db: Db, who: { email: string; role: ProjectRole; token: string; code: string }): Promise<{ userId: number; projectId: number }> {
  const at = '2026-12-01T00:00:00.000Z';
  const [user] = await db('users').insert({ email: who.email, name: `Script ${who.role}`, password_hash: 'x', is_site_admin: false, created_at: at, updated_at: at }).returning('id');
  const [project] = await db('projects')
    .insert({ code: who.code, name: `${who.code} project`, description: '', site_name: 'Script site', site_latitude_deg: 10, site_longitude_deg: 20, site_elevation_m: 100, site_time_zone: 'Etc/UTC', created_at: at, updated_at: at })
    .returning('id');
  await db('project_members').insert({ project_id: project.id, user_id: user.id, role: who.role, added_at: at });
  await db('api_tokens').insert({ user_id: user.id, name: 'script', token_hash: createHash('sha256').update(who.token).digest('hex'), prefix: who.token.slice(0, 10), created_at: at, expires_at: new Date(Date.now() + 365 * 86_400_000).toISOString() });
  return { userId: user.id, projectId: project.id };
}
