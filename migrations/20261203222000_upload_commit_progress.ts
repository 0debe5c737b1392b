import type { Knex } from 'knex';

/**
 * Where an upload's commit has got to (phase, rows written, targets
 * derived, as JSON), written by the process running the commit outside the
 * commit's transaction, so that another app process on the same database
 * can show it. Null until a commit is asked for.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.text('commit_progress_json').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.dropColumn('commit_progress_json');
  });
}
