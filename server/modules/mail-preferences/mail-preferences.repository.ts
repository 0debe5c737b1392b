import type { Db } from '../../db/knex';
import type { MailPreference } from '../../../shared/schemas/mail';
import type { ProjectRole } from '../../../shared/schemas/roles';

export async function listPreferences(db: Db, userId: number): Promise<MailPreference[]> {
  const rows: { id: number; name: string; code: string; role: ProjectRole; weekly_summary: boolean | number | null; review_notice: boolean | number | null }[] = await db(
    'project_members as m',
  )
    .join('projects as p', 'p.id', 'm.project_id')
    .leftJoin('mail_preferences as mp', function joinPrefs() {
      this.on('mp.user_id', '=', 'm.user_id').andOn('mp.project_id', '=', 'm.project_id');
    })
    .where('m.user_id', userId)
    .orderBy('p.name')
    .select('p.id', 'p.name', 'p.code', 'm.role', 'mp.weekly_summary', 'mp.review_notice');
  return rows.map((r) => ({
    projectId: r.id,
    projectName: r.name,
    projectCode: r.code,
    role: r.role,
    weeklySummary: r.role === 'pi' || Boolean(r.weekly_summary),
    summaryAlways: r.role === 'pi',
    reviewNotice: Boolean(r.review_notice),
  }));
}

export async function savePreference(db: Db, userId: number, projectId: number, patch: { weeklySummary?: boolean; reviewNotice?: boolean }, at: Date): Promise<void> {
  const cols: Record<string, unknown> = { updated_at: at.toISOString() };
  if (patch.weeklySummary !== undefined) cols.weekly_summary = patch.weeklySummary;
  if (patch.reviewNotice !== undefined) cols.review_notice = patch.reviewNotice;
  await db('mail_preferences')
    .insert({ user_id: userId, project_id: projectId, weekly_summary: false, review_notice: false, ...cols })
    .onConflict(['user_id', 'project_id'])
    .merge(cols);
}

/** Of the given people, those who asked to hear when their values are reviewed in this project. */
export async function reviewNoticeSubscribers(db: Db, projectId: number, userIds: number[]): Promise<{ id: number; name: string; email: string }[]> {
  if (userIds.length === 0) return [];
  return db('mail_preferences as mp')
    .join('users as u', 'u.id', 'mp.user_id')
    .join('project_members as m', function joinMember() {
      this.on('m.user_id', '=', 'mp.user_id').andOn('m.project_id', '=', 'mp.project_id');
    })
    .where('mp.project_id', projectId)
    .andWhere('mp.review_notice', true)
    .whereIn('mp.user_id', userIds)
    .select('u.id', 'u.name', 'u.email');
}
