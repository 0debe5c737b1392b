import type { Db } from '../../db/knex';
import { permissions } from '../../../shared/schemas/roles';
import type { ListTrailQuery, TrailEntry } from '../../../shared/schemas/trail';
import { neutraliseCell, toCsv } from '../../lib/csv';
import { notFound } from '../../lib/errors';
import { getProjectForUser } from '../projects/projects.repository';
import { eachTrailBatch, listActivity, listEntriesOfPerson, listTrail, type TrailFilters } from './trail.repository';

export type TrailExportFormat = 'csv' | 'json';

export const csvColumns = ['id', 'time_utc', 'person', 'action', 'subject', 'target', 'before', 'after', 'note'] as const;

function json(value: unknown): string {
  return value === null || value === undefined ? '' : JSON.stringify(value);
}

function csvRow(e: TrailEntry): string[] {
  return [
    String(e.id),
    e.createdAt,
    e.actor?.name ?? '',
    e.action,
    e.entityId === null ? e.entityType : `${e.entityType} ${e.entityId}`,
    e.targetDesignation ?? '',
    json(e.before),
    json(e.after),
    e.note,
  ].map(neutraliseCell);
}

async function* csvChunks(batches: AsyncIterable<TrailEntry[]>): AsyncGenerator<string> {
  yield toCsv([[...csvColumns]]);
  for await (const batch of batches) yield toCsv(batch.map(csvRow));
}

async function* jsonChunks(batches: AsyncIterable<TrailEntry[]>): AsyncGenerator<string> {
  yield '[';
  let first = true;
  for await (const batch of batches) {
    for (const e of batch) {
      yield (first ? '\n' : ',\n') + JSON.stringify(e);
      first = false;
    }
  }
  yield '\n]\n';
}

const filtersOf = (q: TrailFilters): TrailFilters => ({ actorId: q.actorId, action: q.action, targetId: q.targetId, from: q.from, to: q.to });

export function createTrailService(db: Db) {
  return {
    async list(projectId: number, query: ListTrailQuery) {
      const { items, total } = await listTrail(db, projectId, filtersOf(query), query);
      return { items, total, page: query.page, pageSize: query.pageSize };
    },

    /**
     * The filtered trail as a file, produced a batch at a time so that the
     * route can stream it; the name carries the project's code.
     */
    async export(projectId: number, userId: number, filters: TrailFilters, format: TrailExportFormat) {
      const project = await getProjectForUser(db, projectId, userId);
      if (!project) throw notFound('No such project.');
      const batches = eachTrailBatch(db, projectId, filtersOf(filters));
      return format === 'csv'
        ? { filename: `${project.code}-trail.csv`, contentType: 'text/csv; charset=utf-8', chunks: csvChunks(batches) }
        : { filename: `${project.code}-trail.json`, contentType: 'application/json; charset=utf-8', chunks: jsonChunks(batches) };
    },

    /** The newest entries of every project whose trail the person's role may read. */
    activity: (userId: number, limit: number) => listActivity(db, userId, permissions.readTrail, limit),

    /** What the person did, and what was done to their account, everywhere (the export of their own data). */
    ofPerson: (userId: number) => listEntriesOfPerson(db, userId),
  };
}

export type TrailService = ReturnType<typeof createTrailService>;
