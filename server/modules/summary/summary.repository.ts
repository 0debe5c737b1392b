import type { Db } from '../../db/knex';
import type { SummarySchedule } from '../../../shared/schemas/mail';
import type { ProjectRole } from '../../../shared/schemas/roles';
import { parseJson, toIso } from '../../lib/rows';
import type { DerivedRow } from '../derived-values/derived-values.repository';

export interface SummaryProject {
  id: number;
  code: string;
  name: string;
  timeZone: string;
  schedule: SummarySchedule;
}

function toSummaryProject(row: {
  id: number;
  code: string;
  name: string;
  site_time_zone: string;
  summary_enabled: boolean | number;
  summary_weekday: number;
  summary_time: string;
}): SummaryProject {
  return {
    id: row.id,
    code: row.code,
    name: row.name,
    timeZone: row.site_time_zone,
    schedule: { enabled: Boolean(row.summary_enabled), weekday: row.summary_weekday, time: row.summary_time },
  };
}

const projectColumns = ['id', 'code', 'name', 'site_time_zone', 'summary_enabled', 'summary_weekday', 'summary_time'];

export async function findSummaryProject(db: Db, projectId: number): Promise<SummaryProject | undefined> {
  const row = await db('projects').where({ id: projectId }).first(projectColumns);
  return row ? toSummaryProject(row) : undefined;
}

export async function listScheduledProjects(db: Db): Promise<SummaryProject[]> {
  const rows = await db('projects').where({ summary_enabled: true }).orderBy('id').select(projectColumns);
  return rows.map(toSummaryProject);
}

export async function updateSchedule(db: Db, projectId: number, schedule: SummarySchedule, at: Date): Promise<void> {
  await db('projects')
    .where({ id: projectId })
    .update({ summary_enabled: schedule.enabled, summary_weekday: schedule.weekday, summary_time: schedule.time, updated_at: at.toISOString() });
}

export interface SummaryRecipient {
  userId: number;
  name: string;
  email: string;
  role: ProjectRole;
  reason: 'pi' | 'opted_in';
}

/** The project's PIs, and every other member who asked for the summary. */
export async function summaryRecipients(db: Db, projectId: number): Promise<SummaryRecipient[]> {
  const rows: { id: number; name: string; email: string; role: ProjectRole; weekly_summary: boolean | number | null }[] = await db('project_members as m')
    .join('users as u', 'u.id', 'm.user_id')
    .leftJoin('mail_preferences as p', function joinPrefs() {
      this.on('p.user_id', '=', 'm.user_id').andOn('p.project_id', '=', 'm.project_id');
    })
    .where('m.project_id', projectId)
    .orderBy('u.name')
    .select('u.id', 'u.name', 'u.email', 'm.role', 'p.weekly_summary');
  return rows
    .filter((r) => r.role === 'pi' || Boolean(r.weekly_summary))
    .map((r) => ({ userId: r.id, name: r.name, email: r.email, role: r.role, reason: r.role === 'pi' ? 'pi' : 'opted_in' }));
}

/** When this week's summary was first queued for the project, if it was. */
export async function weekQueuedAt(db: Db, keyPrefix: string): Promise<string | null> {
  const row = await db('mail_outbox').where('idempotency_key', 'like', `${keyPrefix}%`).min({ at: 'created_at' }).first();
  return row?.at ? toIso(row.at) : null;
}

export async function queuedKeys(db: Db, keys: string[]): Promise<Set<string>> {
  if (keys.length === 0) return new Set();
  const rows: { idempotency_key: string }[] = await db('mail_outbox').whereIn('idempotency_key', keys).select('idempotency_key');
  return new Set(rows.map((r) => r.idempotency_key));
}

// ---- What happened in the period -------------------------------------------

export interface PeriodUpload {
  id: number;
  filename: string;
  kind: string;
  rowCount: number;
  by: string | null;
  committedAt: string;
  targets: { id: number; designation: string }[];
}

export async function uploadsCommitted(db: Db, projectId: number, since: string, until: string): Promise<PeriodUpload[]> {
  const rows: { id: number; filename: string; kind: string; row_count: number; by: string | null; committed_at: unknown }[] = await db('uploads as up')
    .leftJoin('users as u', 'u.id', 'up.user_id')
    .where('up.project_id', projectId)
    .andWhere('up.status', 'committed')
    .andWhere('up.committed_at', '>', since)
    .andWhere('up.committed_at', '<=', until)
    .orderBy('up.committed_at')
    .orderBy('up.id')
    .select('up.id', 'up.filename', 'up.kind', 'up.row_count', 'u.name as by', 'up.committed_at');
  if (rows.length === 0) return [];
  const touched: { upload_id: number; id: number; designation: string }[] = await db('measurements as ms')
    .join('targets as t', 't.id', 'ms.target_id')
    .whereIn(
      'ms.upload_id',
      rows.map((r) => r.id),
    )
    .distinct('ms.upload_id', 't.id', 't.designation')
    .orderBy('t.designation');
  return rows.map((r) => ({
    id: r.id,
    filename: r.filename,
    kind: r.kind,
    rowCount: r.row_count,
    by: r.by,
    committedAt: toIso(r.committed_at),
    targets: touched.filter((t) => t.upload_id === r.id).map((t) => ({ id: t.id, designation: t.designation })),
  }));
}

export interface PeriodValue {
  id: number;
  targetId: number;
  designation: string;
  quantity: string;
  value: number;
  uncertainty: number;
  label: string | null;
  status: DerivedRow['status'];
  note: string;
  warnings: { code: string; quantity: string; message: string }[];
}

/** A derived value's row as the period's queries read it (valueColumns), with its target's designation and any decision note. */
type PeriodValueRow = Pick<DerivedRow, 'id' | 'target_id' | 'quantity' | 'value' | 'uncertainty' | 'label' | 'status' | 'warnings_json'> & {
  designation: string;
  note?: string | null;
};

function toPeriodValue(r: PeriodValueRow): PeriodValue {
  return {
    id: r.id,
    targetId: r.target_id,
    designation: r.designation,
    quantity: r.quantity,
    value: r.value,
    uncertainty: r.uncertainty,
    label: r.label,
    status: r.status,
    note: r.note ?? '',
    warnings: parseJson(r.warnings_json, []),
  };
}

const valueColumns = ['d.id', 'd.target_id', 't.designation', 'd.quantity', 'd.value', 'd.uncertainty', 'd.label', 'd.status', 'd.warnings_json'];

/** The lead's decisions in the period, read from the review trail (a value approved and then superseded within the week still counts). */
export async function decisionsInPeriod(db: Db, projectId: number, since: string, until: string): Promise<{ approved: PeriodValue[]; rejected: PeriodValue[] }> {
  const rows = await db('trail_events as e')
    .join('derived_values as d', 'd.id', 'e.entity_id')
    .join('targets as t', 't.id', 'd.target_id')
    .where('e.project_id', projectId)
    .andWhere('e.entity_type', 'derived_value')
    .whereIn('e.action', ['value.approved', 'value.rejected'])
    .andWhere('e.created_at', '>', since)
    .andWhere('e.created_at', '<=', until)
    .orderBy('t.designation_key')
    .orderBy('d.id')
    .select([...valueColumns, 'e.action', 'e.note']);
  const values = rows.map((r: PeriodValueRow & { action: string }) => ({ action: r.action, value: toPeriodValue(r) }));
  return {
    approved: values.filter((v) => v.action === 'value.approved').map((v) => v.value),
    rejected: values.filter((v) => v.action === 'value.rejected').map((v) => v.value),
  };
}

export async function awaitingReview(db: Db, projectId: number): Promise<PeriodValue[]> {
  const rows = await db('derived_values as d')
    .join('targets as t', 't.id', 'd.target_id')
    .where('d.project_id', projectId)
    .andWhere('d.status', 'proposed')
    .orderBy('t.designation_key')
    .orderBy('d.id')
    .select(valueColumns);
  return rows.map(toPeriodValue);
}

/** Values derived in the period that still stand (proposed or approved). */
export async function derivedInPeriod(db: Db, projectId: number, since: string, until: string): Promise<PeriodValue[]> {
  const rows = await db('derived_values as d')
    .join('targets as t', 't.id', 'd.target_id')
    .where('d.project_id', projectId)
    .whereIn('d.status', ['proposed', 'approved'])
    .andWhere('d.created_at', '>', since)
    .andWhere('d.created_at', '<=', until)
    .orderBy('t.designation_key')
    .orderBy('d.id')
    .select(valueColumns);
  return rows.map(toPeriodValue);
}

/** Every standing (proposed or approved) revision of the given targets, for their cross-checks. */
export async function standingValues(db: Db, targetIds: number[]): Promise<(PeriodValue & { revision: number })[]> {
  if (targetIds.length === 0) return [];
  const rows = await db('derived_values as d')
    .join('targets as t', 't.id', 'd.target_id')
    .whereIn('d.target_id', targetIds)
    .whereIn('d.status', ['proposed', 'approved'])
    .select([...valueColumns, 'd.revision']);
  return rows.map((r: PeriodValueRow & { revision: number }) => ({ ...toPeriodValue(r), revision: r.revision }));
}
