import type { Db } from '../../db/knex';

export interface TrailEntry {
  projectId: number | null;
  actorUserId: number | null;
  action: string;
  entityType: string;
  entityId: number | null;
  before?: unknown;
  after?: unknown;
  note?: string;
}

/** Appends one entry to the review trail, inside the caller's transaction so the record and the change land together. */
export async function appendTrail(trx: Db, entry: TrailEntry, at: Date): Promise<void> {
  await trx('trail_events').insert({
    project_id: entry.projectId,
    actor_user_id: entry.actorUserId,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: entry.entityId,
    before_json: entry.before === undefined ? null : JSON.stringify(entry.before),
    after_json: entry.after === undefined ? null : JSON.stringify(entry.after),
    note: entry.note ?? '',
    created_at: at.toISOString(),
  });
}
