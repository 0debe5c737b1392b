import type { Knex } from 'knex';

/**
 * Indexes for reading large projects a page at a time.
 *
 * The target list sorts a project's targets by right ascension,
 * declination or last change, 50 at a time. Without an index each page
 * sorted the whole project (95 ms a page at 100 000 targets); with one, a
 * page reads its 50 entries in order. SQLite appends the rowid to every
 * index, so the list's tie-break on id comes in order too.
 *
 * A target's values by status: the review queue walks targets in
 * designation order and looks up each one's proposals, and the target list
 * counts each row's proposals. Without it SQLite looked them up through
 * (project_id, status), reading every proposal of the project per target
 * (130 ms for one queue page of a 10 000-target project; under 1 ms with it).
 */
const indexes = [
  ['targets', 'targets_project_ra_index', ['project_id', 'ra_deg']],
  ['targets', 'targets_project_dec_index', ['project_id', 'dec_deg']],
  ['targets', 'targets_project_updated_index', ['project_id', 'updated_at']],
  ['derived_values', 'derived_values_target_status_index', ['target_id', 'status']],
] as const;

export async function up(knex: Knex): Promise<void> {
  for (const [table, name, columns] of indexes) {
    await knex.schema.alterTable(table, (t) => {
      t.index([...columns], name);
    });
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const [table, name, columns] of indexes) {
    await knex.schema.alterTable(table, (t) => {
      t.dropIndex([...columns], name);
    });
  }
}
